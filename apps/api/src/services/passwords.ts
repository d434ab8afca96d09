/**
 * Password hashes with scrypt (node:crypto): `scrypt$N$r$p$salt$hash`, base64url parts. The cost
 * is OWASP's minimum for scrypt (Password Storage Cheat Sheet: N = 2^17, r = 8, p = 1), about
 * 128 MB and a few hundred milliseconds a hash; a hash of an older, cheaper cost still verifies
 * and is replaced at the next sign-in (needsRehash). At most HASHES_AT_ONCE hashes are computed
 * at a time, so that many sign-ins at once cannot take more memory than that.
 */
import crypto from 'node:crypto';
import { invalid, unavailable } from '../errors';
import { API_LIMITS } from '../limits';

export const SCRYPT = Object.freeze({ N: 2 ** 17, r: 8, p: 1 });
const KEYLEN = 32;
/** Hashes computed at once, and hashes waiting (then 503). */
const HASHES_AT_ONCE = 2;
const HASHES_WAITING = 64;

let running = 0;
const waiting: (() => void)[] = [];

async function slot<T>(work: () => Promise<T>): Promise<T> {
  if (running >= HASHES_AT_ONCE) {
    if (waiting.length >= HASHES_WAITING) {
      throw unavailable('Too many sign-ins at once; try again in a moment.');
    }
    await new Promise<void>((resolve) => waiting.push(resolve));
  } else {
    running++;
  }
  try {
    return await work();
  } finally {
    const next = waiting.shift();
    if (next) next();
    else running--;
  }
}

function scrypt(password: string, salt: Buffer, n: number, r: number, p: number): Promise<Buffer> {
  return slot(
    () =>
      new Promise<Buffer>((resolve, reject) =>
        crypto.scrypt(
          password,
          salt,
          KEYLEN,
          // scrypt needs 128·N·r bytes; Node refuses more than maxmem (32 MB by default)
          { N: n, r, p, maxmem: 129 * n * r * Math.max(1, p) },
          (err, key) => (err ? reject(err) : resolve(key)),
        ),
      ),
  );
}

/** Throws 422 unless a new password is of an allowed length (API_LIMITS). */
export function checkNewPassword(password: string, key = 'password'): void {
  if (password.length < API_LIMITS.passwordMin) {
    throw invalid(`${key} needs at least ${API_LIMITS.passwordMin} characters.`);
  }
  if (password.length > API_LIMITS.passwordMax) {
    throw invalid(`${key} has at most ${API_LIMITS.passwordMax} characters.`);
  }
}

export async function hashPassword(password: string): Promise<string> {
  const { N, r, p } = SCRYPT;
  const salt = crypto.randomBytes(16);
  const key = await scrypt(password, salt, N, r, p);
  return ['scrypt', N, r, p, salt.toString('base64url'), key.toString('base64url')].join('$');
}

/** The parameters of a stored hash, or null when it is not one of ours. */
function parse(
  stored: string,
): { n: number; r: number; p: number; salt: Buffer; hash: Buffer } | null {
  const [scheme, n, r, p, salt, hash] = stored.split('$');
  if (scheme !== 'scrypt' || !hash) return null;
  const [N, R, P] = [Number(n), Number(r), Number(p)];
  // a cost no hash of ours has is refused rather than computed
  const ok = (v: number, max: number) => Number.isInteger(v) && v >= 1 && v <= max;
  if (!ok(N, 2 ** 20) || !ok(R, 16) || !ok(P, 4)) return null;
  return {
    n: N,
    r: R,
    p: P,
    salt: Buffer.from(salt, 'base64url'),
    hash: Buffer.from(hash, 'base64url'),
  };
}

export async function verifyPassword(password: string, stored: string | null): Promise<boolean> {
  const h = stored ? parse(stored) : null;
  if (!h) return false;
  const key = await scrypt(password, h.salt, h.n, h.r, h.p);
  return h.hash.length === key.length && crypto.timingSafeEqual(h.hash, key);
}

/** Whether a stored hash was made at a lower cost than SCRYPT (replace it at the next sign-in). */
export function needsRehash(stored: string): boolean {
  const h = parse(stored);
  return h === null || h.n < SCRYPT.N || h.r < SCRYPT.r || h.p < SCRYPT.p;
}

/** A hash of the current cost that no password matches (random salt and key). */
const DUMMY = [
  'scrypt',
  SCRYPT.N,
  SCRYPT.r,
  SCRYPT.p,
  crypto.randomBytes(16).toString('base64url'),
  crypto.randomBytes(KEYLEN).toString('base64url'),
].join('$');

/**
 * Spends the time of one verification for nothing: for an address with no account (or one
 * that cannot sign in with a password), so that the answer takes as long as for an account's
 * wrong password and cannot tell which addresses have accounts.
 */
export async function verifyNothing(password: string): Promise<false> {
  await verifyPassword(password, DUMMY);
  return false;
}
