import type { User } from '@shared/contracts/user';

/** Who made the request, set by the authenticate middleware. */
export interface AuthContext {
  user: User;
  sessionId: string;
  /** How the session token arrived: a browser cookie (CSRF applies) or a Bearer header (scripts). */
  via: 'cookie' | 'bearer';
}

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    interface Request {
      auth?: AuthContext;
    }
  }
}
