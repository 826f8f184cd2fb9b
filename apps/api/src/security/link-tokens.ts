import { createCipheriv, createDecipheriv, createHash, hkdfSync, randomBytes } from 'node:crypto';

/**
 * The secret in an e-mailed link (an invitation or a password reset): 32 random bytes, base64url, 43
 * characters. Only its SHA-256 hash is stored, so a copy of the database cannot be turned into working links.
 */
export function newLinkToken(): { token: string; tokenHash: string } {
  const token = randomBytes(32).toString('base64url');
  return { token, tokenHash: hashLinkToken(token) };
}

export function hashLinkToken(token: string): string {
  return createHash('sha256').update(token, 'utf8').digest('hex');
}

/**
 * Seals a link's secret for the short wait between the request that made it and the worker that mails it
 * (AES-256-GCM, key derived from the session secret with HKDF): the mail queue's rows never hold a usable
 * link, and the sealed copy is dropped once the mail has gone.
 */
export class SecretBox {
  private readonly key: Buffer;

  constructor(secret: string) {
    this.key = Buffer.from(hkdfSync('sha256', secret, 'kerfline', 'mail link secrets v1', 32));
  }

  seal(plain: string): string {
    const iv = randomBytes(12);
    const cipher = createCipheriv('aes-256-gcm', this.key, iv);
    const body = Buffer.concat([cipher.update(plain, 'utf8'), cipher.final()]);
    return [iv, cipher.getAuthTag(), body].map((b) => b.toString('base64url')).join('.');
  }

  /** The sealed text, or null when it was sealed with another key or changed since. */
  open(sealed: string): string | null {
    const [iv, tag, body] = sealed.split('.').map((part) => Buffer.from(part, 'base64url'));
    if (!iv || !tag || !body) return null;
    try {
      const decipher = createDecipheriv('aes-256-gcm', this.key, iv);
      decipher.setAuthTag(tag);
      return Buffer.concat([decipher.update(body), decipher.final()]).toString('utf8');
    } catch {
      return null;
    }
  }
}
