import { randomBytes, scrypt, timingSafeEqual, type ScryptOptions } from 'node:crypto';

// Stored form: scrypt$N$r$p$salt$hash, salt and hash in base64url.
// N = 2^15, r = 8, p = 1: about 32 MiB and some tens of milliseconds per hash on this machine kind.
// OWASP's password storage cheat sheet suggests N = 2^17 for production; this is a local stand-in.
const COST = 2 ** 15;
const BLOCK_SIZE = 8;
const PARALLELISM = 1;
const SALT_BYTES = 16;
const KEY_BYTES = 32;
// Bounds for parameters read back from a stored hash, so a crafted row cannot make us burn memory.
const MAX_COST = 2 ** 20;
const MAX_BLOCK_SIZE = 16;
const MAX_PARALLELISM = 4;

function derive(password: string, salt: Buffer, keyLength: number, options: ScryptOptions): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    scrypt(password.normalize('NFC'), salt, keyLength, options, (error, key) => (error ? reject(error) : resolve(key)));
  });
}

function memoryFor(cost: number, blockSize: number, parallelism: number): number {
  // scrypt needs 128 * N * r bytes (plus 128 * r * p); leave headroom above Node's 32 MiB default.
  return 128 * cost * blockSize * 2 + 128 * blockSize * parallelism + 1024 * 1024;
}

export async function hashPassword(password: string): Promise<string> {
  const salt = randomBytes(SALT_BYTES);
  const key = await derive(password, salt, KEY_BYTES, {
    N: COST,
    r: BLOCK_SIZE,
    p: PARALLELISM,
    maxmem: memoryFor(COST, BLOCK_SIZE, PARALLELISM),
  });
  return ['scrypt', COST, BLOCK_SIZE, PARALLELISM, salt.toString('base64url'), key.toString('base64url')].join('$');
}

function parse(stored: string) {
  const parts = stored.split('$');
  if (parts.length !== 6 || parts[0] !== 'scrypt') return undefined;
  const [cost, blockSize, parallelism] = parts.slice(1, 4).map((p) => (/^\d{1,8}$/.test(p) ? Number(p) : NaN));
  if (cost === undefined || blockSize === undefined || parallelism === undefined) return undefined;
  const powerOfTwo = cost > 1 && (cost & (cost - 1)) === 0;
  if (!powerOfTwo || cost > MAX_COST) return undefined;
  if (!(blockSize >= 1 && blockSize <= MAX_BLOCK_SIZE && parallelism >= 1 && parallelism <= MAX_PARALLELISM)) return undefined;
  const salt = Buffer.from(parts[4] ?? '', 'base64url');
  const key = Buffer.from(parts[5] ?? '', 'base64url');
  if (salt.length < 8 || key.length < 16) return undefined;
  return { cost, blockSize, parallelism, salt, key };
}

/** True when the password matches the stored hash; false for a mismatch or a malformed hash. */
export async function verifyPassword(password: string, stored: string): Promise<boolean> {
  const parsed = parse(stored);
  if (!parsed) return false;
  const { cost, blockSize, parallelism, salt, key } = parsed;
  const candidate = await derive(password, salt, key.length, {
    N: cost,
    r: blockSize,
    p: parallelism,
    maxmem: memoryFor(cost, blockSize, parallelism),
  });
  return timingSafeEqual(candidate, key);
}

let dummy: Promise<string> | undefined;

/** Computes the dummy hash ahead of the first sign-in, so that one is not slower than the rest. */
export async function prepareDummyHash(): Promise<void> {
  dummy ??= hashPassword(randomBytes(16).toString('hex'));
  await dummy;
}

/**
 * Runs a verification that always fails and costs as much as a real one, for sign-ins with an
 * unknown e-mail: the answer then takes about as long as for a known e-mail and a wrong password.
 */
export async function verifyAgainstDummy(password: string): Promise<false> {
  dummy ??= hashPassword(randomBytes(16).toString('hex'));
  await verifyPassword(password, await dummy);
  return false;
}
