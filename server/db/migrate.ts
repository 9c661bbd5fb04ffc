import { promises as fs } from 'node:fs';
import path from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { Migrator, NO_MIGRATIONS, type Migration, type MigrationProvider, type MigrationResult } from 'kysely';
import type { Db } from './connect.ts';

const MIGRATIONS_DIR = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../../migrations');

/**
 * Kysely's FileMigrationProvider, but importing from our own module so that the TypeScript loader
 * in use (tsx at run time, Vite's in tests) handles the .ts migration files.
 */
class FolderMigrationProvider implements MigrationProvider {
  constructor(private readonly folder: string) {}

  async getMigrations(): Promise<Record<string, Migration>> {
    const files = (await fs.readdir(this.folder)).filter((f) => /\.(ts|js)$/.test(f) && !f.endsWith('.d.ts')).sort();
    const migrations: Record<string, Migration> = {};
    for (const file of files) {
      const module = (await import(pathToFileURL(path.join(this.folder, file)).href)) as Migration;
      migrations[file.replace(/\.(ts|js)$/, '')] = { up: module.up, down: module.down };
    }
    return migrations;
  }
}

export function createMigrator(db: Db): Migrator {
  return new Migrator({ db, provider: new FolderMigrationProvider(MIGRATIONS_DIR) });
}

function unwrap(result: { error?: unknown; results?: MigrationResult[] }): MigrationResult[] {
  if (result.error) {
    const failed = result.results?.find((r) => r.status === 'Error');
    const where = failed ? ` in migration ${failed.migrationName}` : '';
    throw new Error(`Migration failed${where}: ${String(result.error instanceof Error ? result.error.message : result.error)}`);
  }
  return result.results ?? [];
}

export async function migrateToLatest(db: Db): Promise<MigrationResult[]> {
  return unwrap(await createMigrator(db).migrateToLatest());
}

export async function migrateDown(db: Db): Promise<MigrationResult[]> {
  return unwrap(await createMigrator(db).migrateDown());
}

/** Undoes every migration, newest first. */
export async function migrateToNothing(db: Db): Promise<MigrationResult[]> {
  return unwrap(await createMigrator(db).migrateTo(NO_MIGRATIONS));
}
