/** `npm run db:restore -- FILE`: replaces the database (DATABASE_URL or the project's own) with a dump, in one transaction. */
import { existsSync } from 'node:fs';
import { parseConfig } from '../server/config.ts';
import { restoreDatabase } from '../server/postgres/backup.ts';
import { withDatabaseUrl } from '../server/postgres/local-database.ts';

const file = process.argv[2];
if (!file || !existsSync(file)) {
  console.error('Give the dump to restore: npm run db:restore -- backups/planktide-<time>.dump');
  process.exit(2);
}
const config = parseConfig(process.env);
await withDatabaseUrl(config, async (url) => restoreDatabase(url, file));
console.log(`Restored ${file}.`);
