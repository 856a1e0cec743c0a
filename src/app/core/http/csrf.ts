// The contract's constants live in a module that also builds its zod schemas; importing them here
// would put zod in the first download, so the names are repeated and a spec keeps them in step.

/** Readable cookie the API sets at sign-in (double-submit CSRF defence). */
export const CSRF_COOKIE_NAME = 'qb_csrf';
/** Header that must echo the cookie on state-changing requests. */
export const CSRF_HEADER_NAME = 'X-CSRF-Token';
