/** Starts a fresh cluster named after the port and returns its database URL. */
export function startBenchDatabase(port: number): string;
/** Stops the cluster and deletes its folder. */
export function removeBenchDatabase(port: number): void;
