import type { z } from 'zod';
import type { Role } from '@shared/contracts/user';

/** One API route as the OpenAPI document describes it; schemas are the same zod schemas the routes parse with. */
export interface Operation {
  method: 'get' | 'post' | 'patch' | 'put' | 'delete';
  /** OpenAPI path template, e.g. /api/users/{id}. */
  path: string;
  summary: string;
  tag: string;
  /** Roles allowed; `public` for routes without sign-in, `any` for every signed-in role. */
  access: Role[] | 'public' | 'any';
  body?: z.ZodType;
  /** A multipart/form-data body instead: one file field and the text fields of a zod object. */
  multipart?: { file: string; fileDescription: string; fields: z.ZodObject };
  query?: z.ZodObject;
  pathParameters?: string[];
  responses: Record<number, { description: string; schema?: z.ZodType; contentType?: string }>;
}
