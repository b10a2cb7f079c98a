import { hash, verify } from '@node-rs/argon2';
import crypto from 'node:crypto';

// argon2id with the OWASP-recommended minimum (19 MiB, 2 passes, 1 lane).
const OPTIONS = { algorithm: 2 /* Algorithm.Argon2id (a const enum) */, memoryCost: 19456, timeCost: 2, parallelism: 1 };

export const hashPassword = (password: string) => hash(password, OPTIONS);
export const verifyPassword = (hashed: string, password: string) => verify(hashed, password).catch(() => false);

/** A random URL-safe token and the SHA-256 that is the only thing stored. */
export function newToken(): { token: string; tokenHash: string } {
  const token = crypto.randomBytes(32).toString('base64url');
  return { token, tokenHash: hashToken(token) };
}
export const hashToken = (token: string) => crypto.createHash('sha256').update(token).digest('hex');

/** A hash to verify against when the e-mail is unknown, so timing does not reveal accounts. */
let dummyHash: Promise<string> | null = null;
export const dummyPasswordHash = () => (dummyHash ??= hashPassword('not-a-real-password-0000'));
