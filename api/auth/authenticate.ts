import type { Request, RequestHandler } from 'express';
import type { Kysely } from 'kysely';
import { CSRF_HEADER, SESSION_COOKIE } from '@shared/contracts/auth';
import type { Role } from '@shared/contracts/user';
import type { Config } from '../config';
import type { Database } from '../db/database';
import { forbidden, HttpProblem, unauthorized } from '../http/problem';
import { toUser } from '../users/user.repository';
import type { SessionCache } from './session-cache';
import { csrfTokenMatches, findLiveSession, verifyToken } from './session.service';
import './auth-context';

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

function presentedToken(req: Request): { token: string; via: 'cookie' | 'bearer' } | null {
  const header = req.get('authorization');
  if (header) {
    const match = /^Bearer\s+(\S+)$/i.exec(header);
    return match ? { token: match[1]!, via: 'bearer' } : null;
  }
  const cookie = (req.cookies as Record<string, unknown> | undefined)?.[SESSION_COOKIE];
  return typeof cookie === 'string' && cookie.length > 0 ? { token: cookie, via: 'cookie' } : null;
}

/**
 * Resolves the session from a Bearer token or the session cookie into `req.auth` (from the session
 * cache when it has the session, from the database otherwise).
 * A cookie session's state-changing requests must echo the session's CSRF token in a header.
 */
export function authenticate(db: Kysely<Database>, config: Config, sessions: SessionCache | null): RequestHandler {
  return async (req, _res, next) => {
    const presented = presentedToken(req);
    if (!presented) return next();
    const claims = verifyToken(config, presented.token);
    if (!claims) return next();
    let row = sessions?.get(claims.sid);
    if (row && row.id !== claims.sub) row = undefined;
    if (!row) {
      const ticket = sessions?.ticket() ?? 0;
      const live = await findLiveSession(db, claims);
      if (!live) return next();
      row = live.user;
      sessions?.store(ticket, claims.sid, live.user, live.expiresAt);
    }
    if (presented.via === 'cookie' && !SAFE_METHODS.has(req.method) && !csrfTokenMatches(config.sessionSecret, claims.sid, req.get(CSRF_HEADER))) {
      throw new HttpProblem(403, 'CSRF check failed', `Requests made with the session cookie must send the ${CSRF_HEADER} header; reload the page and try again.`);
    }
    req.auth = { user: toUser(row), sessionId: claims.sid, via: presented.via };
    next();
  };
}

/** Lets the request through only for a signed-in user with one of the roles (any role when none given). */
export function requireRole(...roles: Role[]): RequestHandler {
  return (req, _res, next) => {
    if (!req.auth) throw unauthorized();
    if (roles.length > 0 && !roles.includes(req.auth.user.role)) throw forbidden(`This needs the ${roles.join(' or ')} role.`);
    next();
  };
}
