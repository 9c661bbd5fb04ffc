/** `npm run db:backup [-- FILE]`: dumps the database (DATABASE_URL or the project's own) with pg_dump. */
import { mkdirSync } from 'node:fs';
import path from 'node:path';
import { parseConfig } from '../server/config.ts';
import { backupDatabase } from '../server/postgres/backup.ts';
import { withDatabaseUrl } from '../server/postgres/local-database.ts';

const config = parseConfig(process.env);
const stamp = new Date().toISOString().replace(/[-:]/g, '').replace(/\.\d+Z$/, 'Z');
const file = path.resolve(process.argv[2] ?? path.join('backups', `planktide-${stamp}.dump`));
mkdirSync(path.dirname(file), { recursive: true });
await withDatabaseUrl(config, async (url) => backupDatabase(url, file));
console.log(`Backup written to ${path.relative(process.cwd(), file)}`);
