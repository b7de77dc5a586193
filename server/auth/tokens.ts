import { createHash, randomBytes, timingSafeEqual } from 'node:crypto';

/** SHA-256 in hex: how API and invitation tokens are stored (the token itself never is). */
export const sha256Hex = (text: string) => createHash('sha256').update(text).digest('hex');

/** A new secret token: a recognisable `ab_` prefix and 32 random bytes, URL-safe. */
export function newSecretToken(): string {
  return `ab_${randomBytes(32).toString('base64url')}`;
}

/** Equal strings in constant time (for tokens compared with what the session holds). */
export function sameSecret(a: string, b: string): boolean {
  const x = Buffer.from(a);
  const y = Buffer.from(b);
  return x.length === y.length && timingSafeEqual(x, y);
}
