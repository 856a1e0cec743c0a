import type { Kysely, Transaction } from 'kysely';
import type { AuditEvent } from '@shared/contracts/reviews-api';
import type { Database } from '../db/database';

type Db = Kysely<Database> | Transaction<Database>;

export async function recordEvent(
  db: Db,
  event: { designId: string; versionNumber?: number | null; actorId: string | null; action: AuditEvent['action']; detail?: Record<string, unknown> },
): Promise<void> {
  await db
    .insertInto('audit_events')
    .values({
      design_id: event.designId,
      version_number: event.versionNumber ?? null,
      actor_id: event.actorId,
      action: event.action,
      detail: JSON.stringify(event.detail ?? {}),
    })
    .execute();
}

export async function listEvents(db: Db, designId: string): Promise<AuditEvent[]> {
  const rows = await db
    .selectFrom('audit_events')
    .leftJoin('users', 'users.id', 'audit_events.actor_id')
    .select([
      'audit_events.id',
      'audit_events.version_number',
      'audit_events.action',
      'audit_events.detail',
      'audit_events.created_at',
      'users.id as actor_id',
      'users.display_name as actor_name',
      'users.email as actor_email',
    ])
    .where('audit_events.design_id', '=', designId)
    .orderBy('audit_events.id')
    .execute();
  return rows.map((row) => ({
    id: String(row.id),
    versionNumber: row.version_number,
    actor: row.actor_id ? { id: row.actor_id, displayName: row.actor_name ?? '', email: row.actor_email ?? '' } : null,
    action: row.action as AuditEvent['action'],
    detail: row.detail,
    createdAt: new Date(row.created_at).toISOString(),
  }));
}
