import { sql, type Kysely, type Transaction } from 'kysely';
import nodemailer, { type Transporter } from 'nodemailer';
import type { Logger } from 'pino';
import type { Database } from '../db/database';

export interface OutgoingMail {
  to: string;
  subject: string;
  text: string;
  html: string;
  reviewId?: string | null;
}

/** Queues a message in the same transaction as the change it reports, so neither is lost without the other. */
export async function enqueueMail(db: Kysely<Database> | Transaction<Database>, mail: OutgoingMail): Promise<string> {
  const row = await db
    .insertInto('outbox')
    .values({ to_address: mail.to, subject: mail.subject, text_body: mail.text, html_body: mail.html, review_id: mail.reviewId ?? null })
    .returning('id')
    .executeTakeFirstOrThrow();
  return row.id;
}

export function createSmtpTransport(smtpUrl: string): Transporter {
  return nodemailer.createTransport(smtpUrl, { connectionTimeout: 5000, greetingTimeout: 5000, socketTimeout: 10000 } as object);
}

/** Delay before the next attempt after `attempts` failures: 2 s doubling up to 5 minutes. */
export function retryDelayMs(attempts: number): number {
  return Math.min(300_000, 2000 * 2 ** Math.max(0, attempts - 1));
}

export interface Outbox {
  /** Sends what is due now; returns how many went out. */
  deliverDue(): Promise<number>;
  /** Asks for a delivery round soon (after a message was queued). */
  wake(): void;
  start(): void;
  stop(): Promise<void>;
}

/**
 * Delivers queued mail with retries. Rows are claimed with `for update skip locked`, so several API
 * replicas can run the same loop without sending a message twice.
 */
export function createOutbox(deps: { db: Kysely<Database>; transport: Transporter; from: string; logger: Logger; pollMs?: number }): Outbox {
  const { db, transport, from, logger } = deps;
  const pollMs = deps.pollMs ?? 5000;
  let timer: NodeJS.Timeout | undefined;
  let running: Promise<number> | null = null;
  let stopped = true;

  async function deliverOne(): Promise<boolean> {
    return db.transaction().execute(async (trx) => {
      const message = await trx
        .selectFrom('outbox')
        .selectAll()
        .where('sent_at', 'is', null)
        .where('next_attempt_at', '<=', sql<Date>`now()`)
        .orderBy('created_at')
        .limit(1)
        .forUpdate()
        .skipLocked()
        .executeTakeFirst();
      if (!message) return false;
      try {
        await transport.sendMail({ from, to: message.to_address, subject: message.subject, text: message.text_body, html: message.html_body });
        await trx.updateTable('outbox').set({ sent_at: sql`now()`, attempts: message.attempts + 1, last_error: null }).where('id', '=', message.id).execute();
      } catch (error) {
        const attempts = message.attempts + 1;
        await trx
          .updateTable('outbox')
          .set({
            attempts,
            last_error: error instanceof Error ? error.message.slice(0, 500) : String(error),
            next_attempt_at: new Date(Date.now() + retryDelayMs(attempts)),
          })
          .where('id', '=', message.id)
          .execute();
        logger.warn({ err: error, to: message.to_address, attempts }, 'mail not delivered; will retry');
        return false;
      }
      return true;
    });
  }

  async function round(): Promise<number> {
    let sent = 0;
    try {
      while (await deliverOne()) sent += 1;
    } catch (error) {
      logger.warn({ err: error }, 'outbox round failed; will retry');
    }
    return sent;
  }

  function schedule(delay: number) {
    if (stopped) return;
    clearTimeout(timer);
    timer = setTimeout(() => {
      void outbox.deliverDue().finally(() => schedule(pollMs));
    }, delay);
    timer.unref();
  }

  const outbox: Outbox = {
    deliverDue() {
      running ??= round().finally(() => {
        running = null;
      });
      return running;
    },
    wake() {
      schedule(0);
    },
    start() {
      stopped = false;
      schedule(0);
    },
    async stop() {
      stopped = true;
      clearTimeout(timer);
      await running;
    },
  };
  return outbox;
}
