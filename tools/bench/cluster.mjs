// The load benchmark's own PostgreSQL cluster: its own folder and port, durable like a real one.
import { crashCluster, freezeCluster, thawCluster } from '../db-faults.mjs';
import { databaseUrl, removeCluster, startCluster, stopCluster } from '../db.mjs';

export function startBenchDatabase(port) {
  const name = `pg-bench-${port}`;
  removeCluster({ name, port });
  startCluster({ name, port, database: 'quietbridge_bench' });
  return databaseUrl(port, 'quietbridge_bench');
}

export function removeBenchDatabase(port) {
  removeCluster({ name: `pg-bench-${port}`, port });
}

/**
 * The outage run's cluster (tools/bench/outage.ts): durable like a real one, stopped, frozen and
 * crashed on purpose while the API runs on it.
 */
export function outageDatabase(port) {
  const cluster = { name: `pg-outage-${port}`, port };
  const database = 'quietbridge_outage';
  return {
    url: databaseUrl(port, database),
    create() {
      removeCluster(cluster);
      startCluster({ ...cluster, database });
    },
    start: () => startCluster({ ...cluster, database }),
    stop: () => stopCluster(cluster),
    freeze: () => freezeCluster(cluster),
    thaw: (pids) => thawCluster(pids),
    crash: () => crashCluster(cluster),
    remove: () => removeCluster(cluster),
  };
}
