import { z } from 'zod';
import {
  createDesignSchema,
  designListSchema,
  designSummarySchema,
  listDesignsQuerySchema,
  saveVersionSchema,
  updateDesignSchema,
  versionConflictSchema,
  versionSchema,
  versionSummarySchema,
} from '@shared/contracts/designs-api';
import type { Operation } from '../openapi/operation';

const signedIn = 'any' as const;

export const designOperations: Operation[] = [
  {
    method: 'get',
    path: '/api/designs',
    summary: 'List the designs you may see (designers: their own; admins: all), with their latest key figures',
    tag: 'Designs',
    access: signedIn,
    query: listDesignsQuerySchema,
    responses: { 200: { description: 'One page of designs', schema: designListSchema } },
  },
  {
    method: 'post',
    path: '/api/designs',
    summary: 'Create a design; its document becomes version 1',
    tag: 'Designs',
    access: ['designer', 'admin'],
    body: createDesignSchema,
    responses: { 201: { description: 'Created', schema: designSummarySchema }, 400: { description: 'Body or document not valid (paths like document.chain[2].corner)' } },
  },
  {
    method: 'get',
    path: '/api/designs/{id}',
    summary: 'One design with its latest version summary',
    tag: 'Designs',
    access: signedIn,
    pathParameters: ['id'],
    responses: { 200: { description: 'The design', schema: designSummarySchema }, 404: { description: 'No such design, or not yours' } },
  },
  {
    method: 'patch',
    path: '/api/designs/{id}',
    summary: 'Rename, archive or restore a design',
    tag: 'Designs',
    access: signedIn,
    pathParameters: ['id'],
    body: updateDesignSchema,
    responses: { 200: { description: 'Updated', schema: designSummarySchema }, 404: { description: 'No such design, or not yours' } },
  },
  {
    method: 'get',
    path: '/api/designs/{id}/versions',
    summary: 'The versions of a design, newest first (without documents)',
    tag: 'Versions',
    access: signedIn,
    pathParameters: ['id'],
    responses: { 200: { description: 'Versions', schema: z.object({ items: z.array(versionSummarySchema) }) }, 404: { description: 'No such design, or not yours' } },
  },
  {
    method: 'post',
    path: '/api/designs/{id}/versions',
    summary: 'Save a new version on top of baseVersion; 409 when a newer version exists (nothing is overwritten)',
    tag: 'Versions',
    access: signedIn,
    pathParameters: ['id'],
    body: saveVersionSchema,
    responses: {
      201: { description: 'Saved', schema: versionSchema },
      400: { description: 'Body or document not valid' },
      404: { description: 'No such design, or not yours' },
      409: { description: 'baseVersion is not the latest, or the design is archived', schema: versionConflictSchema, contentType: 'application/problem+json' },
    },
  },
  {
    method: 'get',
    path: '/api/designs/{id}/versions/{number}',
    summary: 'One immutable version: document, message, author, time, format version and key figures',
    tag: 'Versions',
    access: signedIn,
    pathParameters: ['id', 'number'],
    responses: { 200: { description: 'The version', schema: versionSchema }, 404: { description: 'No such design or version' } },
  },
];
