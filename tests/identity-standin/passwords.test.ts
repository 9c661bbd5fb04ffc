import { scryptSync } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { hashPassword, verifyPassword } from '../../server/identity-standin/passwords.ts';

describe('stand-in password hashing', () => {
  it('stores scrypt$N$r$p$salt$hash with N = 2^15, r = 8, p = 1', async () => {
    const stored = await hashPassword('correct horse battery');
    const [scheme, n, r, p, salt, hash] = stored.split('$');
    expect(scheme).toBe('scrypt');
    expect([Number(n), Number(r), Number(p)]).toEqual([32768, 8, 1]);
    expect(Buffer.from(salt ?? '', 'base64url')).toHaveLength(16);
    expect(Buffer.from(hash ?? '', 'base64url')).toHaveLength(32);
  });

  it('derives the stored hash exactly as node:crypto scrypt does with the stored salt and parameters', async () => {
    const stored = await hashPassword('tidal constituent M2');
    const [, n, r, p, salt = '', hash] = stored.split('$');
    const expected = scryptSync('tidal constituent M2', Buffer.from(salt, 'base64url'), 32, { N: Number(n), r: Number(r), p: Number(p), maxmem: 64 * 1024 * 1024 });
    expect(hash).toBe(expected.toString('base64url'));
  });

  it('uses a fresh random salt for every hash', async () => {
    const [a, b] = await Promise.all([hashPassword('same password'), hashPassword('same password')]);
    expect(a).not.toBe(b);
  });

  it('accepts the right password and rejects a wrong one', async () => {
    const stored = await hashPassword('phytoplankton bloom');
    expect(await verifyPassword('phytoplankton bloom', stored)).toBe(true);
    expect(await verifyPassword('phytoplankton bloom ', stored)).toBe(false);
    expect(await verifyPassword('', stored)).toBe(false);
  });

  it('rejects malformed hashes and parameters too costly to try', async () => {
    const stored = await hashPassword('kelp');
    const parts = stored.split('$');
    expect(await verifyPassword('kelp', 'plain-text-kelp')).toBe(false);
    expect(await verifyPassword('kelp', parts.slice(0, 5).join('$'))).toBe(false);
    expect(await verifyPassword('kelp', ['bcrypt', ...parts.slice(1)].join('$'))).toBe(false);
    expect(await verifyPassword('kelp', [parts[0], 2 ** 24, ...parts.slice(2)].join('$'))).toBe(false);
    expect(await verifyPassword('kelp', [parts[0], 30000, ...parts.slice(2)].join('$'))).toBe(false);
  });
});
