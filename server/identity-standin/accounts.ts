import { sql, type ColumnType, type Generated, type Kysely, type Selectable } from 'kysely';
import { z } from 'zod';
import { hashPassword } from './passwords.ts';

/** The stand-in's own table, in its own PostgreSQL schema; the app never reads it. */
export interface StandInAccountTable {
  id: Generated<string>;
  email: string;
  password_hash: string;
  display_name: string;
  email_verified: Generated<boolean>;
  created_at: ColumnType<Date, Date | string | undefined, never>;
}

export interface StandInDatabase {
  'identity_standin.accounts': StandInAccountTable;
}

/**
 * Whatever database the host app uses (its Kysely Database type knows nothing of our schema),
 * with the stand-in's migration applied. Only this module talks to it, through StandInDatabase.
 */
// eslint-disable-next-line @typescript-eslint/no-explicit-any -- any app database type; narrowed in table() below
export type HostDb = Kysely<any>;

export type StandInAccountRow = Selectable<StandInAccountTable>;

export interface StandInAccount {
  id: string;
  email: string;
  emailVerified: boolean;
  displayName: string;
  passwordHash: string;
}

const TABLE = 'identity_standin.accounts' as const;
const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

export const emailSchema = z
  .string()
  .trim()
  .max(254, 'E-mail is too long.')
  .pipe(z.email('Enter an e-mail address like name@example.com.'))
  .transform((email) => email.toLowerCase());

export const PASSWORD_MIN = 10;
export const PASSWORD_MAX = 200;

export const newAccountSchema = z.object({
  email: emailSchema,
  password: z
    .string()
    .min(PASSWORD_MIN, `Choose a password of at least ${PASSWORD_MIN} characters.`)
    .max(PASSWORD_MAX, `Choose a password of at most ${PASSWORD_MAX} characters.`),
  displayName: z.string().trim().min(1, 'Enter your name.').max(120, 'Your name is too long (at most 120 characters).'),
});

export type NewAccount = z.input<typeof newAccountSchema>;

function toAccount(row: StandInAccountRow): StandInAccount {
  return {
    id: row.id,
    email: row.email,
    emailVerified: row.email_verified,
    displayName: row.display_name,
    passwordHash: row.password_hash,
  };
}

function table(db: HostDb): Kysely<StandInDatabase> {
  return db as Kysely<StandInDatabase>;
}

export async function findAccountById(db: HostDb, id: string): Promise<StandInAccount | undefined> {
  if (!UUID.test(id)) return undefined;
  const row = await table(db).selectFrom(TABLE).selectAll().where('id', '=', id).executeTakeFirst();
  return row && toAccount(row);
}

export async function findAccountByEmail(db: HostDb, email: string): Promise<StandInAccount | undefined> {
  const row = await table(db)
    .selectFrom(TABLE)
    .selectAll()
    .where(sql<string>`lower(email)`, '=', email.trim().toLowerCase())
    .executeTakeFirst();
  return row && toAccount(row);
}

/** Inserts the account; undefined when the e-mail is taken already. */
export async function createAccount(
  db: HostDb,
  input: NewAccount,
  options: { emailVerified?: boolean } = {},
): Promise<StandInAccount | undefined> {
  const account = newAccountSchema.parse(input);
  const passwordHash = await hashPassword(account.password);
  const row = await table(db)
    .insertInto(TABLE)
    .values({
      email: account.email,
      password_hash: passwordHash,
      display_name: account.displayName,
      email_verified: options.emailVerified ?? false,
    })
    .onConflict((oc) => oc.expression(sql`lower(email)`).doNothing())
    .returningAll()
    .executeTakeFirst();
  return row && toAccount(row);
}

/**
 * Creates the given accounts when their e-mail is not taken yet (idempotent: existing accounts,
 * their passwords included, are left alone). Seeded accounts count as verified. Returns the e-mails created.
 */
export async function seedStandInAccounts(
  db: HostDb,
  accounts: ReadonlyArray<{ email: string; password: string; displayName: string }>,
): Promise<string[]> {
  const created: string[] = [];
  for (const account of accounts) {
    if (await findAccountByEmail(db, account.email)) continue;
    const row = await createAccount(db, account, { emailVerified: true });
    if (row) created.push(row.email);
  }
  return created;
}
