import { z } from 'zod';
import { createUserSchema, listUsersQuerySchema, updateUserSchema, userListSchema, userSchema } from '@shared/contracts/user';
import type { Operation } from '../openapi/operation';

const userEnvelope = z.object({ user: userSchema });

export const userOperations: Operation[] = [
  {
    method: 'get',
    path: '/api/users',
    summary: 'List accounts, sorted and paged',
    tag: 'Accounts',
    access: ['admin'],
    query: listUsersQuerySchema,
    responses: { 200: { description: 'One page of accounts', schema: userListSchema } },
  },
  {
    method: 'post',
    path: '/api/users',
    summary: 'Create an account',
    tag: 'Accounts',
    access: ['admin'],
    body: createUserSchema,
    responses: {
      201: { description: 'Created', schema: userEnvelope },
      400: { description: 'Body not valid or password not accepted' },
      409: { description: 'E-mail already has an account' },
    },
  },
  {
    method: 'patch',
    path: '/api/users/{id}',
    summary: 'Rename, change the role of, disable or enable an account',
    tag: 'Accounts',
    access: ['admin'],
    pathParameters: ['id'],
    body: updateUserSchema,
    responses: {
      200: { description: 'Updated', schema: userEnvelope },
      404: { description: 'No such account' },
      409: { description: 'Would leave no enabled administrator' },
    },
  },
];
