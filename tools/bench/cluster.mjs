// The load benchmark's own PostgreSQL cluster: its own folder and port, durable like a real one.
import { databaseUrl, removeCluster, startCluster } from '../db.mjs';

export function startBenchDatabase(port) {
  const name = `pg-bench-${port}`;
  removeCluster({ name, port });
  startCluster({ name, port, database: 'quietbridge_bench' });
  return databaseUrl(port, 'quietbridge_bench');
}

export function removeBenchDatabase(port) {
  removeCluster({ name: `pg-bench-${port}`, port });
}
