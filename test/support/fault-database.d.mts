export const FAULT_PGPORT: number;
export const FAULT_CLUSTER: string;
export const FAULT_DATABASE: string;
/** A fresh cluster with the durability settings of a real one (fsync on); returns its database URL. */
export function createFaultDatabase(): string;
export function stopFaultDatabase(): void;
export function restartFaultDatabase(): void;
export function removeFaultDatabase(): void;
/** Freezes the server (SIGSTOP): connections stay open but nothing answers; returns the frozen process ids. */
export function freezeFaultDatabase(): number[];
export function thawFaultDatabase(pids: number[]): void;
