import { sql } from 'kysely';
import type { Db } from '../../server/db/connect.ts';

/**
 * Row count and a checksum of the contents of every table of the product: pg-boss's own queue is
 * excluded, and so are sign-in sessions, which every request refreshes (rolling expiry).
 */
export async function fingerprint(db: Db): Promise<Record<string, { rows: number; md5: string | null }>> {
  const tables = await sql<{ schema: string; name: string }>`
    select table_schema as schema, table_name as name from information_schema.tables
    where table_schema in ('public', 'identity_standin') and table_type = 'BASE TABLE' and table_name <> 'app_sessions' order by 1, 2`.execute(db);
  const out: Record<string, { rows: number; md5: string | null }> = {};
  for (const t of tables.rows) {
    const ref = sql.table(`${t.schema}.${t.name}`);
    const row = await sql<{ rows: number; md5: string | null }>`select count(*)::int as rows, md5(string_agg(x::text, '|' order by x::text)) as md5 from ${ref} as x`.execute(db);
    out[`${t.schema}.${t.name}`] = row.rows[0]!;
  }
  return out;
}
