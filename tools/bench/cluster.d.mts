/** Starts a fresh cluster named after the port and returns its database URL. */
export function startBenchDatabase(port: number): string;
/** Stops the cluster and deletes its folder. */
export function removeBenchDatabase(port: number): void;

export interface OutageDatabase {
  url: string;
  /** A fresh cluster (any old one on the port removed), started. */
  create(): void;
  /** Starts it again on the same data (after a stop or a crash: crash recovery). */
  start(): void;
  /** Fast shutdown: connections are terminated, the data stays. */
  stop(): void;
  /** SIGSTOP to every server process; returns them for thaw. */
  freeze(): number[];
  thaw(pids: number[]): void;
  /** SIGKILL to every server process. */
  crash(): number[];
  remove(): void;
}
export function outageDatabase(port: number): OutageDatabase;
