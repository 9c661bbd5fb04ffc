import { parseConfig } from '../config.ts';
import { createDb } from './connect.ts';
import { migrateDown, migrateToLatest } from './migrate.ts';
import { withDatabaseUrl } from '../postgres/local-database.ts';

const direction = process.argv[2] ?? 'up';
if (direction !== 'up' && direction !== 'down') {
  console.error(`Unknown direction "${direction}": use "up" or "down".`);
  process.exit(2);
}

const config = parseConfig(process.env);
await withDatabaseUrl(config, async (url) => {
  const db = createDb(url, 1);
  try {
    const results = direction === 'up' ? await migrateToLatest(db) : await migrateDown(db);
    if (results.length === 0) console.log(direction === 'up' ? 'Already at the latest migration.' : 'No migration to undo.');
    for (const r of results) console.log(`${r.direction === 'Up' ? 'applied' : 'undone'}: ${r.migrationName} (${r.status})`);
  } finally {
    await db.destroy();
  }
});
