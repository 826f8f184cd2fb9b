import { hash, verify } from '@node-rs/argon2';

/** Argon2id with the library's defaults (memory-hard, the algorithm OWASP recommends for passwords). */
export function hashPassword(password: string): Promise<string> {
  return hash(password);
}

export function verifyPassword(passwordHash: string, password: string): Promise<boolean> {
  return verify(passwordHash, password);
}
