import { sql } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { findAccountByEmail, findAccountById, seedStandInAccounts } from '../../server/identity-standin/accounts.ts';
import { verifyPassword } from '../../server/identity-standin/passwords.ts';
import { createTestDatabase, type TestDatabase } from '../helpers/test-database.ts';

describe('stand-in accounts', () => {
  let database: TestDatabase;
  beforeAll(async () => {
    database = await createTestDatabase();
  });
  afterAll(async () => {
    await database?.drop();
  });

  it('seeds accounts only when their e-mail is missing, leaving existing passwords alone', async () => {
    const first = await seedStandInAccounts(database.db, [
      { email: 'Owner@Example.test', password: 'first password here', displayName: 'Owner' },
      { email: 'crew@example.test', password: 'crew password here', displayName: 'Crew' },
    ]);
    expect(first).toEqual(['owner@example.test', 'crew@example.test']);
    const second = await seedStandInAccounts(database.db, [
      { email: 'owner@example.test', password: 'a different password', displayName: 'Owner again' },
      { email: 'biologist@example.test', password: 'biologist password', displayName: 'Biologist' },
    ]);
    expect(second).toEqual(['biologist@example.test']);
    const owner = await findAccountByEmail(database.db, 'OWNER@example.test');
    expect(owner?.displayName).toBe('Owner');
    expect(owner?.emailVerified).toBe(true);
    expect(await verifyPassword('first password here', owner?.passwordHash ?? '')).toBe(true);
    const count = await sql<{ n: number }>`select count(*)::int as n from identity_standin.accounts`.execute(database.db);
    expect(count.rows[0]?.n).toBe(3);
  });

  it('keeps e-mails unique regardless of case in the database itself', async () => {
    await expect(
      sql`insert into identity_standin.accounts (email, password_hash, display_name) values ('CREW@example.test', 'x', 'Copy')`.execute(database.db),
    ).rejects.toThrow(/accounts_email_unique/);
  });

  it('finds no account for an id that is not a UUID, without a database error', async () => {
    expect(await findAccountById(database.db, "1' or '1'='1")).toBeUndefined();
    expect(await findAccountById(database.db, '00000000-0000-4000-8000-000000000000')).toBeUndefined();
  });
});
