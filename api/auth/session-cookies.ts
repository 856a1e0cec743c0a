import type { CookieOptions, Response } from 'express';
import { CSRF_COOKIE, SESSION_COOKIE } from '@shared/contracts/constants';
import type { Config } from '../config';
import type { IssuedSession } from './session.service';

function base(config: Config): CookieOptions {
  return { sameSite: 'strict', secure: config.cookieSecure, path: '/' };
}

/** The httpOnly session cookie and the readable CSRF cookie that the client echoes in a header. */
export function setSessionCookies(res: Response, config: Config, session: IssuedSession): void {
  const maxAge = config.sessionTtlSeconds * 1000;
  res.cookie(SESSION_COOKIE, session.token, { ...base(config), httpOnly: true, maxAge });
  res.cookie(CSRF_COOKIE, session.csrfToken, { ...base(config), httpOnly: false, maxAge });
}

export function clearSessionCookies(res: Response, config: Config): void {
  res.clearCookie(SESSION_COOKIE, { ...base(config), httpOnly: true });
  res.clearCookie(CSRF_COOKIE, base(config));
}
