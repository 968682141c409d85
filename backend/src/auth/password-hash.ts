import { randomBytes, scrypt, timingSafeEqual, type ScryptOptions } from 'node:crypto';

/**
 * Password hashing with node's scrypt. Defaults follow the OWASP Password Storage Cheat Sheet's scrypt
 * line (N = 2^17, r = 8, p = 1; from memory). The parameters are stored in the hash, so a lower cost in
 * tests (SCRYPT_LOG_N) and a higher one later both verify.
 * Format: scrypt$<log2 N>$<r>$<p>$<salt b64>$<hash b64>
 */
const KEY_LENGTH = 32;

function scryptAsync(password: string, salt: Buffer, options: ScryptOptions): Promise<Buffer> {
  return new Promise((resolve, reject) =>
    scrypt(password.normalize('NFKC'), salt, KEY_LENGTH, options, (err, key) =>
      err ? reject(err) : resolve(key),
    ),
  );
}

function options(logN: number, r: number, p: number): ScryptOptions {
  const N = 2 ** logN;
  return { N, r, p, maxmem: 128 * N * r * p + 16 * 1024 * 1024 };
}

export async function hashPassword(password: string): Promise<string> {
  const logN = Number(process.env.SCRYPT_LOG_N ?? 17);
  const salt = randomBytes(16);
  const key = await scryptAsync(password, salt, options(logN, 8, 1));
  return ['scrypt', logN, 8, 1, salt.toString('base64'), key.toString('base64')].join('$');
}

export async function verifyPassword(password: string, stored: string): Promise<boolean> {
  const [scheme, logN, r, p, salt, key] = stored.split('$');
  if (scheme !== 'scrypt' || !logN || !r || !p || !salt || !key) return false;
  const expected = Buffer.from(key, 'base64');
  const actual = await scryptAsync(password, Buffer.from(salt, 'base64'), options(+logN, +r, +p));
  return actual.length === expected.length && timingSafeEqual(actual, expected);
}

/** Spends the same time as a real check, so an unknown e-mail answers no faster than a wrong password. */
let dummy: Promise<string> | undefined;
export async function burnPasswordCheck(password: string): Promise<void> {
  dummy ??= hashPassword('not-a-real-password-just-for-timing');
  await verifyPassword(password, await dummy);
}
