import { Router } from 'express';
import type { Kysely } from 'kysely';
import { z } from 'zod';
import { createUserSchema, listUsersQuerySchema, updateUserSchema } from '@shared/contracts/user';
import { requireRole } from '../auth/authenticate';
import { passwordProblems } from '../auth/password-policy';
import type { SessionCache } from '../auth/session-cache';
import { revokeSessionsOf } from '../auth/session.service';
import type { Config } from '../config';
import type { Database } from '../db/database';
import { badRequest, conflict, notFound } from '../http/problem';
import { parseOrThrow } from '../http/validate';
import { countEnabledAdmins, findUserByEmail, findUserById, insertUser, listUsers, toUser, updateUser } from './user.repository';
import { hashPassword } from '../auth/password-hashing';

const userIdSchema = z.object({ id: z.string().uuid('Account id must be a UUID') });

function isUniqueViolation(error: unknown): boolean {
  return typeof error === 'object' && error !== null && (error as { code?: unknown }).code === '23505';
}

export function userRouter(db: Kysely<Database>, config: Config, sessions: SessionCache | null = null): Router {
  const router = Router();
  router.use('/users', requireRole('admin'));

  router.get('/users', async (req, res) => {
    const query = parseOrThrow(listUsersQuerySchema, req.query, 'query');
    const { rows, total } = await listUsers(db, query);
    res.json({ items: rows.map(toUser), total, page: query.page, pageSize: query.pageSize });
  });

  router.post('/users', async (req, res) => {
    const body = parseOrThrow(createUserSchema, req.body, 'body');
    const problems = passwordProblems(body.password, body.email);
    if (problems.length > 0) throw badRequest(`The password is not accepted: ${problems[0]!.message}.`, problems);
    const emailTaken = conflict('An account with this e-mail already exists.', [{ path: 'email', message: 'This e-mail already has an account' }]);
    if (await findUserByEmail(db, body.email)) throw emailTaken;
    try {
      const row = await insertUser(db, {
        email: body.email,
        display_name: body.displayName,
        role: body.role,
        password_hash: await hashPassword(body.password, config.bcryptCost),
      });
      res.status(201).location(`/api/users/${row.id}`).json({ user: toUser(row) });
    } catch (error) {
      if (isUniqueViolation(error)) throw emailTaken;
      throw error;
    }
  });

  router.patch('/users/:id', async (req, res) => {
    const { id } = parseOrThrow(userIdSchema, req.params, 'path');
    const body = parseOrThrow(updateUserSchema, req.body, 'body');
    const existing = await findUserById(db, id);
    if (!existing) throw notFound('No account with this id.');
    if (id === req.auth!.user.id && (body.disabled === true || (body.role !== undefined && body.role !== 'admin'))) {
      throw conflict('You cannot disable your own account or take away your own administrator role; ask another administrator.', [
        { path: body.disabled === true ? 'disabled' : 'role', message: 'Not on your own account' },
      ]);
    }
    const losesAdmin = existing.role === 'admin' && !existing.disabled && ((body.role && body.role !== 'admin') || body.disabled === true);
    if (losesAdmin && (await countEnabledAdmins(db, id)) === 0) {
      throw conflict('This is the last enabled administrator; make another account an administrator first.', [
        { path: body.disabled === true ? 'disabled' : 'role', message: 'The last enabled administrator must stay' },
      ]);
    }
    const row = await updateUser(db, id, {
      ...(body.displayName !== undefined ? { display_name: body.displayName } : {}),
      ...(body.role !== undefined ? { role: body.role } : {}),
      ...(body.disabled !== undefined ? { disabled: body.disabled } : {}),
    });
    if (!row) throw notFound('No account with this id.');
    if (body.disabled === true || (body.role !== undefined && body.role !== existing.role)) await revokeSessionsOf(db, id);
    // Any change to the account (its name shows in answers too) before the answer goes out.
    sessions?.forgetUser(id);
    res.json({ user: toUser(row) });
  });

  return router;
}
