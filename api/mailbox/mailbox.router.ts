import { Router } from 'express';
import type { Kysely } from 'kysely';
import { z } from 'zod';
import type { MailboxMessage } from '@shared/contracts/reviews-api';
import { requireRole } from '../auth/authenticate';
import type { Database, MailboxMessagesTable } from '../db/database';
import { notFound } from '../http/problem';
import { parseOrThrow } from '../http/validate';
import type { Selectable } from 'kysely';

const listQuery = z.object({
  limit: z.coerce.number({ error: 'Limit must be a number' }).int().min(1, 'Limit must be at least 1').max(500, 'Limit must be at most 500').default(100),
  to: z.string().max(254, 'To must be at most 254 characters').optional(),
});
const messagePath = z.object({ id: z.string().uuid('Message id must be a UUID') });

function toMessage(row: Selectable<MailboxMessagesTable>): MailboxMessage {
  return {
    id: row.id,
    from: row.envelope_from,
    to: row.recipients,
    subject: row.subject,
    text: row.text_body,
    html: row.html_body,
    receivedAt: new Date(row.received_at).toISOString(),
  };
}

/** The local mail catcher's messages, newest first: admins only. */
export function mailboxRouter(db: Kysely<Database>): Router {
  const router = Router();
  router.use('/mailbox', requireRole('admin'));

  router.get('/mailbox', async (req, res) => {
    const query = parseOrThrow(listQuery, req.query, 'query');
    let select = db.selectFrom('mailbox_messages').selectAll().orderBy('received_at', 'desc').orderBy('id').limit(query.limit);
    if (query.to) select = select.where((eb) => eb(eb.val(query.to!.toLowerCase()), '=', eb.fn.any('recipients')));
    res.json({ items: (await select.execute()).map(toMessage) });
  });

  router.get('/mailbox/:id', async (req, res) => {
    const { id } = parseOrThrow(messagePath, req.params, 'path');
    const row = await db.selectFrom('mailbox_messages').selectAll().where('id', '=', id).executeTakeFirst();
    if (!row) throw notFound('No such message in the mailbox.');
    res.json(toMessage(row));
  });
  return router;
}
