import type { FieldError, Problem } from '@shared/contracts/problem';

/** An error that the central handler answers as a JSON problem with its own status. */
export class HttpProblem extends Error {
  constructor(
    readonly status: number,
    readonly title: string,
    readonly detail: string,
    readonly errors: FieldError[] = [],
    readonly headers: Record<string, string> = {},
  ) {
    super(detail);
  }

  toJSON(): Problem {
    return { status: this.status, title: this.title, detail: this.detail, errors: this.errors };
  }
}

export const badRequest = (detail: string, errors: FieldError[] = []) => new HttpProblem(400, 'Bad request', detail, errors);
export const unauthorized = (detail = 'Sign in to continue.') => new HttpProblem(401, 'Not signed in', detail);
export const forbidden = (detail = 'Your role does not allow this.') => new HttpProblem(403, 'Forbidden', detail);
export const notFound = (detail = 'Nothing here.') => new HttpProblem(404, 'Not found', detail);
export const conflict = (detail: string, errors: FieldError[] = []) => new HttpProblem(409, 'Conflict', detail, errors);
