// Faults a PostgreSQL cluster of tools/db.mjs can be put through while the API runs on it: the
// fault suite (test/integration/faults.test.ts) and the long outage run (tools/bench/outage.ts).
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { clusterPaths } from './db.mjs';

/** The server's processes: the postmaster (from its pid file) and every process it started. */
export function serverPids({ name, port }) {
  const { dataDir } = clusterPaths(name, port);
  const postmaster = Number(readFileSync(join(dataDir, 'postmaster.pid'), 'utf8').split('\n')[0]);
  const children = readdirSync('/proc')
    .filter((entry) => /^\d+$/.test(entry))
    .filter((entry) => {
      try {
        // Field 4 of /proc/<pid>/stat is the parent; the command name before it may hold spaces.
        const stat = readFileSync(`/proc/${entry}/stat`, 'utf8');
        return Number(stat.slice(stat.lastIndexOf(')') + 2).split(' ')[1]) === postmaster;
      } catch {
        return false;
      }
    })
    .map(Number);
  return [postmaster, ...children];
}

/** Freezes the server (SIGSTOP): connections stay open but nothing answers, as behind a dead link. */
export function freezeCluster(cluster) {
  const pids = serverPids(cluster);
  for (const pid of pids) process.kill(pid, 'SIGSTOP');
  return pids;
}

export function thawCluster(pids) {
  for (const pid of pids) process.kill(pid, 'SIGCONT');
}

/** Kills the postmaster outright (SIGKILL to it and its processes): the next start runs crash recovery. */
export function crashCluster(cluster) {
  const pids = serverPids(cluster);
  for (const pid of pids) {
    try {
      process.kill(pid, 'SIGKILL');
    } catch {
      // already gone
    }
  }
  return pids;
}
