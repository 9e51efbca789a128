import { randomBytes, scrypt, timingSafeEqual } from 'node:crypto';

/** scrypt's cost (N = 2^14, r 8, p 1: the parameters RFC 7914 and common practice give for interactive sign-in). */
const N = 16_384;
const R = 8;
const P = 1;
const KEY_BYTES = 64;
const SALT_BYTES = 16;
/** Passwords shorter than this are refused when an account is made (common practice, no source). */
export const MIN_PASSWORD_LENGTH = 12;

function derive(password: string, salt: Buffer, n: number, r: number, p: number, bytes: number): Promise<Buffer> {
  return new Promise((done, fail) =>
    scrypt(password.normalize('NFC'), salt, bytes, { N: n, r, p, maxmem: 256 * n * r + 1024 * 1024 }, (e, key) => (e ? fail(e) : done(key))),
  );
}

/** The stored form of a password: `scrypt$N$r$p$salt$key`, salt and key in base64; the password itself is never kept. */
export async function hashPassword(password: string): Promise<string> {
  const salt = randomBytes(SALT_BYTES);
  const key = await derive(password, salt, N, R, P, KEY_BYTES);
  return `scrypt$${N}$${R}$${P}$${salt.toString('base64')}$${key.toString('base64')}`;
}

/** Whether a password matches its stored form, compared in constant time; false for a form that cannot be read. */
export async function verifyPassword(password: string, stored: string): Promise<boolean> {
  const [kind, n, r, p, salt, key] = stored.split('$');
  if (kind !== 'scrypt' || !n || !r || !p || !salt || !key) return false;
  const expected = Buffer.from(key, 'base64');
  const got = await derive(password, Buffer.from(salt, 'base64'), Number(n), Number(r), Number(p), expected.length);
  return got.length === expected.length && timingSafeEqual(got, expected);
}
