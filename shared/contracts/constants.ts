// Plain values of the API contract with no zod in sight, so the browser can import them without
// pulling the schema library into its first download.

/** Name of the httpOnly session cookie holding the JWT. */
export const SESSION_COOKIE = 'qb_session';
/** Name of the readable cookie holding the CSRF token (double-submit, bound to the session). */
export const CSRF_COOKIE = 'qb_csrf';
/** Header a cookie-authenticated state-changing request must carry, equal to the CSRF cookie. */
export const CSRF_HEADER = 'X-CSRF-Token';

/** Longest design name the API accepts, counted after trimming. */
export const DESIGN_NAME_MAX_LENGTH = 200;

/** Shortest password the API accepts. */
export const PASSWORD_MIN_LENGTH = 10;

/** The roles, in the order forms offer them. */
export const roles = ['admin', 'designer', 'reviewer'] as const;
export type Role = (typeof roles)[number];
