import type { Role } from '@shared/contracts/user';

// Repeated from the contract, whose module also builds zod schemas that the browser does not need;
// account-rules.spec.ts keeps these in step with it.

/** Shortest password the API accepts. */
export const PASSWORD_MIN_LENGTH = 10;

/** Roles in the order the forms offer them. */
export const ROLES: readonly Role[] = ['admin', 'designer', 'reviewer'];
