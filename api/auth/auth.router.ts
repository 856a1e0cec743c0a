import { randomBytes } from 'node:crypto';
import { Router } from 'express';
import type { Kysely } from 'kysely';
import { changePasswordSchema, signInSchema } from '@shared/contracts/auth';
import type { Config } from '../config';
import type { Database } from '../db/database';
import { badRequest, HttpProblem } from '../http/problem';
import { parseOrThrow } from '../http/validate';
import { findUserByEmail, findUserById, toUser, updateUser } from '../users/user.repository';
import { requireRole } from './authenticate';
import { hashPassword, verifyPassword } from './password-hashing';
import { passwordProblems } from './password-policy';
import type { SessionCache } from './session-cache';
import { clearSessionCookies, setSessionCookies } from './session-cookies';
import { issueSession, revokeSession, revokeSessionsOf } from './session.service';
import { signInLimits } from './sign-in-limits';

export function authRouter(db: Kysely<Database>, config: Config, sessions: SessionCache | null = null): Router {
  const router = Router();
  // Compared against when the e-mail is unknown, at the cost of real hashes, so a wrong address takes
  // as long to answer as a wrong password and the timing does not tell which e-mails have accounts.
  let unknownUserHash: Promise<string> | undefined;
  const hashOfNoAccount = () => (unknownUserHash ??= hashPassword(randomBytes(18).toString('base64'), config.bcryptCost));
  router.post('/auth/sign-in', ...signInLimits(config), async (req, res) => {
    const body = parseOrThrow(signInSchema, req.body, 'body');
    const user = await findUserByEmail(db, body.email);
    const passwordOk = await verifyPassword(body.password, user?.password_hash ?? (await hashOfNoAccount()));
    if (!user || !passwordOk) throw new HttpProblem(401, 'Sign-in failed', 'The e-mail or the password is wrong.');
    if (user.disabled) throw new HttpProblem(401, 'Sign-in failed', 'This account is disabled; ask an administrator to enable it.');
    const session = await issueSession(db, config, user, { userAgent: req.get('user-agent') ?? null, address: req.ip ?? null });
    setSessionCookies(res, config, session);
    res.json({ user: toUser(user), token: session.token, expiresAt: session.expiresAt.toISOString() });
  });

  router.post('/auth/sign-out', requireRole(), async (req, res) => {
    await revokeSession(db, req.auth!.sessionId);
    sessions?.forgetUser(req.auth!.user.id);
    clearSessionCookies(res, config);
    res.status(204).end();
  });

  router.get('/auth/me', requireRole(), (req, res) => {
    res.json({ user: req.auth!.user });
  });

  router.post('/auth/password', requireRole(), async (req, res) => {
    const body = parseOrThrow(changePasswordSchema, req.body, 'body');
    const user = await findUserById(db, req.auth!.user.id);
    if (!user || !(await verifyPassword(body.currentPassword, user.password_hash))) {
      throw badRequest('The current password is wrong.', [{ path: 'currentPassword', message: 'Current password is wrong' }]);
    }
    const problems = passwordProblems(body.newPassword, user.email, 'newPassword');
    if (body.newPassword === body.currentPassword) problems.push({ path: 'newPassword', message: 'New password must differ from the current one' });
    if (problems.length > 0) throw badRequest(`The new password is not accepted: ${problems[0]!.message}.`, problems);
    await updateUser(db, user.id, { password_hash: await hashPassword(body.newPassword, config.bcryptCost) });
    await revokeSessionsOf(db, user.id, req.auth!.sessionId);
    sessions?.forgetUser(user.id);
    res.status(204).end();
  });

  return router;
}
