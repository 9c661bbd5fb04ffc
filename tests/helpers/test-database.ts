import { randomBytes } from 'node:crypto';
import pg from 'pg';
import { inject } from 'vitest';
import { createDb, ensureDatabase, type Db } from '../../server/db/connect.ts';
import { migrateToLatest } from '../../server/db/migrate.ts';

export interface TestDatabase {
  db: Db;
  url: string;
  name: string;
  drop(): Promise<void>;
}

function urlWithDatabase(adminUrl: string, name: string): string {
  const url = new URL(adminUrl);
  url.pathname = `/${name}`;
  return url.toString();
}

/** A fresh, empty database in the run's throwaway cluster; migrated unless told otherwise. */
export async function createTestDatabase(options: { migrate?: boolean } = {}): Promise<TestDatabase> {
  const adminUrl = inject('pgAdminUrl');
  const name = `t_${randomBytes(6).toString('hex')}`;
  await ensureDatabase(adminUrl, name);
  const url = urlWithDatabase(adminUrl, name);
  const db = createDb(url, 4);
  if (options.migrate !== false) await migrateToLatest(db);
  return {
    db,
    url,
    name,
    async drop() {
      await db.destroy();
      const admin = new pg.Client({ connectionString: adminUrl });
      await admin.connect();
      try {
        await admin.query(`drop database if exists ${name} with (force)`);
      } finally {
        await admin.end();
      }
    },
  };
}
