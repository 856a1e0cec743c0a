// `npm run migrate`: applies every pending migration in sql/migrations to DATABASE_URL.
import { loadConfig } from '../api/config';
import { createDatabase } from '../api/db/database';
import { migrateToLatest } from '../api/db/migrator';

const config = loadConfig();
const db = createDatabase(config.databaseUrl, { max: 1 });
try {
  const { error, results } = await migrateToLatest(db);
  for (const result of results ?? []) {
    process.stdout.write(`[migrate] ${result.migrationName}: ${result.status}\n`);
  }
  if (error) {
    process.stderr.write(`[migrate] failed: ${error instanceof Error ? error.message : String(error)}\n`);
    process.exitCode = 1;
  } else if (!results?.length) {
    process.stdout.write('[migrate] schema is up to date\n');
  }
} finally {
  await db.destroy();
}
