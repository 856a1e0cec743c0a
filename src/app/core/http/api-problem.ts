import { HttpErrorResponse } from '@angular/common/http';
import type { FieldError, Problem } from '@shared/contracts/problem';

function isFieldError(value: unknown): value is FieldError {
  return (
    typeof value === 'object' &&
    value !== null &&
    typeof (value as FieldError).path === 'string' &&
    typeof (value as FieldError).message === 'string'
  );
}

/**
 * The API's problem answer for a failed request, or one built from the HTTP status when the body is
 * not a problem (server unreachable, proxy error page).
 */
export function problemFrom(error: unknown): Problem {
  if (!(error instanceof HttpErrorResponse)) {
    return { status: 0, title: 'Unexpected error', detail: String(error), errors: [] };
  }
  const body: unknown = error.error;
  if (typeof body === 'object' && body !== null && typeof (body as Problem).detail === 'string') {
    const problem = body as Partial<Problem>;
    return {
      status: typeof problem.status === 'number' ? problem.status : error.status,
      title: typeof problem.title === 'string' ? problem.title : error.statusText,
      detail: problem.detail ?? '',
      errors: Array.isArray(problem.errors) ? problem.errors.filter(isFieldError) : [],
    };
  }
  if (error.status === 0) {
    return {
      status: 0,
      title: 'Server unreachable',
      detail: 'The Quietbridge server cannot be reached. Check that it is running and try again.',
      errors: [],
    };
  }
  return {
    status: error.status,
    title: error.statusText || 'Request failed',
    detail: `The server answered ${error.status}${error.statusText ? ` ${error.statusText}` : ''}.`,
    errors: [],
  };
}

/** Seconds from a `Retry-After` header given in seconds; null when absent or not a number. */
export function retryAfterSeconds(error: unknown): number | null {
  if (!(error instanceof HttpErrorResponse)) return null;
  const header = error.headers.get('Retry-After');
  if (header === null) return null;
  const seconds = Number(header.trim());
  return Number.isFinite(seconds) && seconds >= 0 ? Math.ceil(seconds) : null;
}
