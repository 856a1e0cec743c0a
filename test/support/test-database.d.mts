export const TEST_CLUSTER: string;
export const TEST_PGPORT: number;
export const TEST_DATABASE: string;
/** Starts a fresh throwaway cluster and returns its database URL. */
export function startTestDatabase(): string;
export function stopTestDatabase(): void;
