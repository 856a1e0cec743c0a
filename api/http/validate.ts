import type { z } from 'zod';
import { fieldErrorsFromZod } from '@shared/contracts/problem';
import { badRequest } from './problem';

/** Parses a request part with a zod schema; a mismatch becomes a 400 problem listing each field. */
export function parseOrThrow<S extends z.ZodType>(schema: S, value: unknown, part: 'body' | 'query' | 'path'): z.output<S> {
  const result = schema.safeParse(value ?? (part === 'body' ? undefined : {}));
  if (result.success) return result.data;
  const errors = fieldErrorsFromZod(result.error).map((error) => ({ ...error, path: error.path || part }));
  const first = errors[0];
  const detail =
    value === undefined && part === 'body'
      ? 'The request needs a JSON body (Content-Type: application/json).'
      : `The request ${part} is not valid${first ? `: ${first.path}: ${first.message}` : ''}.`;
  throw badRequest(detail, errors);
}
