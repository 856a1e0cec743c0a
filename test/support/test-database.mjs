// A throwaway PostgreSQL cluster for the test suites: its own folder, its own port, fsync off.
import { databaseUrl, removeCluster, startCluster } from '../../tools/db.mjs';

export const TEST_PGPORT = Number(process.env.TEST_PGPORT ?? 54339);
// One folder per port, so that suites run side by side on different ports never share a cluster.
export const TEST_CLUSTER = `pg-test-${TEST_PGPORT}`;
export const TEST_DATABASE = 'quietbridge_test';

export function startTestDatabase() {
  removeCluster({ name: TEST_CLUSTER, port: TEST_PGPORT });
  startCluster({ name: TEST_CLUSTER, port: TEST_PGPORT, database: TEST_DATABASE, fast: true });
  return databaseUrl(TEST_PGPORT, TEST_DATABASE);
}

export function stopTestDatabase() {
  removeCluster({ name: TEST_CLUSTER, port: TEST_PGPORT });
}
