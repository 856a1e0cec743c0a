import { z } from 'zod';

/** One field-level error inside a problem answer; `path` is dotted with indices, e.g. `chain[2].corner`. */
export const fieldErrorSchema = z.object({
  path: z.string().describe('Where the error is, e.g. "email" or "chain[2].corner"'),
  message: z.string().describe('What is wrong, in words a user can act on'),
});

/** Every error the API answers has this JSON shape. */
export const problemSchema = z
  .object({
    status: z.number().int().describe('HTTP status code'),
    title: z.string().describe('Short summary of the kind of problem'),
    detail: z.string().describe('What went wrong in this request'),
    errors: z.array(fieldErrorSchema).describe('Field-level errors; empty when none apply'),
  })
  .meta({ id: 'Problem' });

export type FieldError = z.infer<typeof fieldErrorSchema>;
export type Problem = z.infer<typeof problemSchema>;

/** Formats a zod issue path as `chain[2].corner`. */
export function formatIssuePath(path: ReadonlyArray<PropertyKey>): string {
  let out = '';
  for (const part of path) {
    if (typeof part === 'number') out += `[${part}]`;
    else out += out === '' ? String(part) : `.${String(part)}`;
  }
  return out;
}

/** Turns a zod error into field errors with readable paths. */
export function fieldErrorsFromZod(error: z.ZodError): FieldError[] {
  return error.issues.map((issue) => ({ path: formatIssuePath(issue.path), message: issue.message }));
}
