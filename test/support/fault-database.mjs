// A second throwaway PostgreSQL cluster that a test may stop and start while the API runs on it.
// Its port follows the suites' own (TEST_PGPORT + 1 unless TEST_FAULT_PGPORT is set), so suites
// run side by side on different ports never share it.
import { freezeCluster, thawCluster } from '../../tools/db-faults.mjs';
import { databaseUrl, removeCluster, startCluster, stopCluster } from '../../tools/db.mjs';

export const FAULT_PGPORT = Number(process.env.TEST_FAULT_PGPORT ?? Number(process.env.TEST_PGPORT ?? 54339) + 1);
export const FAULT_CLUSTER = `pg-faults-${FAULT_PGPORT}`;
export const FAULT_DATABASE = 'quietbridge_faults';

/** A fresh cluster with the durability settings of a real one (fsync on); returns its database URL. */
export function createFaultDatabase() {
  removeCluster({ name: FAULT_CLUSTER, port: FAULT_PGPORT });
  startCluster({ name: FAULT_CLUSTER, port: FAULT_PGPORT, database: FAULT_DATABASE });
  return databaseUrl(FAULT_PGPORT, FAULT_DATABASE);
}

/** Stops the server (fast shutdown: open connections are terminated); the data stays. */
export function stopFaultDatabase() {
  stopCluster({ name: FAULT_CLUSTER, port: FAULT_PGPORT });
}

/** Starts the stopped server again on the same data. */
export function restartFaultDatabase() {
  startCluster({ name: FAULT_CLUSTER, port: FAULT_PGPORT, database: FAULT_DATABASE });
}

export function removeFaultDatabase() {
  removeCluster({ name: FAULT_CLUSTER, port: FAULT_PGPORT });
}

/** Freezes the server (SIGSTOP): connections stay open but nothing answers, as behind a dead link. */
export function freezeFaultDatabase() {
  return freezeCluster({ name: FAULT_CLUSTER, port: FAULT_PGPORT });
}

export function thawFaultDatabase(pids) {
  thawCluster(pids);
}
