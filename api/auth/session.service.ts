import { createHmac, createSecretKey, timingSafeEqual, type KeyObject } from 'node:crypto';
import jwt from 'jsonwebtoken';
import { sql, type Kysely } from 'kysely';
import type { Config } from '../config';
import type { Database, UserRow } from '../db/database';

const ISSUER = 'quietbridge';

export interface IssuedSession {
  sessionId: string;
  token: string;
  expiresAt: Date;
  csrfToken: string;
}

interface TokenClaims {
  sub: string;
  sid: string;
}

const signingKeys = new Map<string, KeyObject>();

/**
 * The secret as a key object, made once: given a string, jsonwebtoken first tries to read it as a
 * PEM public key on every verification, and that failed attempt cost more than the rest of a
 * session check.
 */
function signingKey(secret: string): KeyObject {
  let key = signingKeys.get(secret);
  if (!key) signingKeys.set(secret, (key = createSecretKey(Buffer.from(secret, 'utf8'))));
  return key;
}

/** The CSRF token is bound to the session, so a cookie planted from elsewhere cannot match it. */
export function csrfTokenFor(secret: string, sessionId: string): string {
  return createHmac('sha256', secret).update(`csrf:${sessionId}`).digest('base64url');
}

export function csrfTokenMatches(secret: string, sessionId: string, presented: string | undefined): boolean {
  if (!presented) return false;
  const expected = Buffer.from(csrfTokenFor(secret, sessionId));
  const given = Buffer.from(presented);
  return expected.length === given.length && timingSafeEqual(expected, given);
}

export async function issueSession(
  db: Kysely<Database>,
  config: Config,
  user: UserRow,
  meta: { userAgent: string | null; address: string | null },
): Promise<IssuedSession> {
  const expiresAt = new Date(Date.now() + config.sessionTtlSeconds * 1000);
  const row = await db
    .insertInto('sessions')
    .values({ user_id: user.id, expires_at: expiresAt, user_agent: meta.userAgent?.slice(0, 500) ?? null, address: meta.address })
    .returning('id')
    .executeTakeFirstOrThrow();
  const token = jwt.sign({ sid: row.id }, signingKey(config.sessionSecret), {
    algorithm: 'HS256',
    subject: user.id,
    issuer: ISSUER,
    expiresIn: config.sessionTtlSeconds,
  });
  return { sessionId: row.id, token, expiresAt, csrfToken: csrfTokenFor(config.sessionSecret, row.id) };
}

/** The token's claims when its signature, issuer and expiry hold; null otherwise. */
export function verifyToken(config: Config, token: string): TokenClaims | null {
  try {
    const claims = jwt.verify(token, signingKey(config.sessionSecret), { algorithms: ['HS256'], issuer: ISSUER });
    if (typeof claims !== 'object' || typeof claims.sub !== 'string' || typeof claims['sid'] !== 'string') return null;
    return { sub: claims.sub, sid: claims['sid'] as string };
  } catch {
    return null;
  }
}

/** The user of a live session (not revoked, not expired, account enabled), and when the session expires. */
export async function findLiveSession(db: Kysely<Database>, claims: TokenClaims): Promise<{ user: UserRow; expiresAt: Date } | undefined> {
  if (!/^[0-9a-f-]{36}$/i.test(claims.sid)) return undefined;
  const row = await db
    .selectFrom('sessions')
    .innerJoin('users', 'users.id', 'sessions.user_id')
    .selectAll('users')
    .select('sessions.expires_at as session_expires_at')
    .where('sessions.id', '=', claims.sid)
    .where('sessions.user_id', '=', claims.sub)
    .where('sessions.revoked_at', 'is', null)
    .where('sessions.expires_at', '>', sql<Date>`now()`)
    .where('users.disabled', '=', false)
    .executeTakeFirst();
  if (!row) return undefined;
  const { session_expires_at: expiresAt, ...user } = row;
  return { user, expiresAt };
}

export async function revokeSession(db: Kysely<Database>, sessionId: string): Promise<void> {
  await db.updateTable('sessions').set({ revoked_at: sql`now()` }).where('id', '=', sessionId).where('revoked_at', 'is', null).execute();
}

export async function revokeSessionsOf(db: Kysely<Database>, userId: string, keepSessionId?: string): Promise<void> {
  let query = db.updateTable('sessions').set({ revoked_at: sql`now()` }).where('user_id', '=', userId).where('revoked_at', 'is', null);
  if (keepSessionId) query = query.where('id', '!=', keepSessionId);
  await query.execute();
}
