import { createHash, randomBytes } from 'node:crypto';
import { sql, type Kysely, type Transaction } from 'kysely';
import type { Database } from '../db/database';

export function hashToken(token: string): string {
  return createHash('sha256').update(token).digest('hex');
}

/** A new one-time sign-up token; only its hash is stored, so a database leak yields no usable links. */
export async function createInvitation(trx: Transaction<Database>, email: string, invitedBy: string, ttlMs: number): Promise<{ token: string; expiresAt: Date }> {
  const token = randomBytes(32).toString('base64url');
  const expiresAt = new Date(Date.now() + ttlMs);
  await trx.insertInto('invitations').values({ token_hash: hashToken(token), email, invited_by: invitedBy, expires_at: expiresAt }).execute();
  return { token, expiresAt };
}

export type InvitationLookup =
  | { state: 'valid'; id: string; email: string; expiresAt: Date; invitedBy: string }
  | { state: 'used' | 'expired' | 'unknown' };

export async function lookUpInvitation(db: Kysely<Database> | Transaction<Database>, token: string): Promise<InvitationLookup> {
  const row = await db
    .selectFrom('invitations')
    .innerJoin('users', 'users.id', 'invitations.invited_by')
    .select(['invitations.id', 'invitations.email', 'invitations.expires_at', 'invitations.used_at', 'users.display_name'])
    .where('invitations.token_hash', '=', hashToken(token))
    .executeTakeFirst();
  if (!row) return { state: 'unknown' };
  if (row.used_at) return { state: 'used' };
  if (new Date(row.expires_at).getTime() <= Date.now()) return { state: 'expired' };
  return { state: 'valid', id: row.id, email: row.email, expiresAt: new Date(row.expires_at), invitedBy: row.display_name };
}

/** Marks the invitation used if nobody did first; the single row update makes the link one-time under races. */
export async function consumeInvitation(trx: Transaction<Database>, id: string): Promise<boolean> {
  const result = await trx
    .updateTable('invitations')
    .set({ used_at: sql`now()` })
    .where('id', '=', id)
    .where('used_at', 'is', null)
    .where('expires_at', '>', sql<Date>`now()`)
    .executeTakeFirst();
  return Number(result.numUpdatedRows) === 1;
}
