import { createHmac, timingSafeEqual } from 'node:crypto';

/**
 * Per-interaction form tokens: an HMAC of the interaction id under a key derived from the cookie keys.
 * A form post must carry both the signed interaction cookie (SameSite=Lax, so not sent by cross-site
 * posts) and the token, which only a page served by the stand-in for that interaction contains.
 */
export interface FormTokens {
  issue(uid: string): string;
  check(uid: string, token: unknown): boolean;
}

export function createFormTokens(cookieKeys: readonly string[]): FormTokens {
  const keys = cookieKeys.map((key) => createHmac('sha256', key).update('planktide identity stand-in form token').digest());
  const tokenFor = (key: Buffer, uid: string) => createHmac('sha256', key).update(uid).digest();
  return {
    issue(uid) {
      const key = keys[0];
      if (!key) throw new Error('No cookie key configured');
      return tokenFor(key, uid).toString('base64url');
    },
    check(uid, token) {
      if (typeof token !== 'string' || token.length > 100) return false;
      const given = Buffer.from(token, 'base64url');
      // Every key is tried (rotation) and every comparison made, so timing does not depend on which matched.
      let ok = false;
      for (const key of keys) {
        const expected = tokenFor(key, uid);
        if (given.length === expected.length && timingSafeEqual(given, expected)) ok = true;
      }
      return ok;
    },
  };
}
