// Vitest global setup for the API suites: uses TEST_DATABASE_URL when the caller (npm test) made
// the database, otherwise starts a throwaway cluster of its own and removes it afterwards.
import { execFileSync } from 'node:child_process';
import { startTestDatabase, stopTestDatabase } from './test-database.mjs';

export default function setup(): () => void {
  const ownCluster = !process.env.TEST_DATABASE_URL;
  const url = process.env.TEST_DATABASE_URL ?? startTestDatabase();
  process.env.TEST_DATABASE_URL = url;
  // Migrations are .ts files loaded by Kysely's file provider: run them under tsx, as `npm run migrate` does.
  execFileSync(process.execPath, ['--import', 'tsx', 'tools/migrate.ts'], { env: { ...process.env, DATABASE_URL: url }, stdio: 'inherit' });
  return () => {
    if (ownCluster) stopTestDatabase();
  };
}
