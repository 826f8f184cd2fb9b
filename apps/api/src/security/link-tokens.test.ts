import { describe, expect, it } from 'vitest';
import { createHash } from 'node:crypto';
import { linkTokenSchema } from '@kerfline/domain/auth/schema';
import { SecretBox, hashLinkToken, newLinkToken } from './link-tokens.js';

describe('link tokens', () => {
  it('are 43 base64url characters the schema accepts, stored only as their SHA-256', () => {
    const { token, tokenHash } = newLinkToken();
    expect(linkTokenSchema.safeParse(token).success).toBe(true);
    expect(tokenHash).toBe(createHash('sha256').update(token).digest('hex'));
    expect(tokenHash).not.toContain(token);
    expect(newLinkToken().token).not.toBe(token);
    expect(hashLinkToken(token)).toBe(tokenHash);
  });

  it('seal and open with the same secret only, and refuse a changed box', () => {
    const box = new SecretBox('a-session-secret-of-some-length');
    const sealed = box.seal('the-link-secret');
    expect(sealed).not.toContain('the-link-secret');
    expect(box.open(sealed)).toBe('the-link-secret');
    expect(new SecretBox('another-secret-of-some-length').open(sealed)).toBeNull();
    const [iv, tag, body] = sealed.split('.');
    // The second-to-last character changed for another (looking at that character: looking at the last one, as
    // before, left it as it was one time in 64).
    const flipped = `${iv}.${tag}.${body!.slice(0, -2)}${body!.at(-2) === 'A' ? 'B' : 'A'}${body!.slice(-1)}`;
    expect(flipped).not.toBe(sealed);
    expect(box.open(flipped)).toBeNull();
    expect(box.open('not-a-box')).toBeNull();
  });
});
