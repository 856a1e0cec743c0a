import { promises as fs } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { FileMigrationProvider, Migrator, type Kysely, type MigrationResultSet } from 'kysely';

export const migrationFolder = fileURLToPath(new URL('../../sql/migrations', import.meta.url));

/** Brings the schema to the newest migration in sql/migrations. */
export async function migrateToLatest(db: Kysely<any>): Promise<MigrationResultSet> {
  const migrator = new Migrator({
    db,
    provider: new FileMigrationProvider({ fs, path, migrationFolder }),
  });
  return migrator.migrateToLatest();
}
