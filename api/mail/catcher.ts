import type { Kysely } from 'kysely';
import { simpleParser } from 'mailparser';
import { SMTPServer } from 'smtp-server';
import type { Database } from '../db/database';

const MAX_MESSAGE_BYTES = 5 * 1024 * 1024;

export interface MailCatcher {
  port: number;
  close(): Promise<void>;
}

/**
 * The local mail catcher: an SMTP server on loopback that accepts every message and stores it in
 * PostgreSQL for the Mailbox page. Only for local use and tests; production points SMTP_URL elsewhere.
 */
export async function startMailCatcher(db: Kysely<Database>, port: number, host = '127.0.0.1'): Promise<MailCatcher> {
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS', 'AUTH'],
    size: MAX_MESSAGE_BYTES,
    logger: false,
    onData(stream, session, callback) {
      const chunks: Buffer[] = [];
      stream.on('data', (chunk: Buffer) => chunks.push(chunk));
      stream.on('end', () => {
        const raw = Buffer.concat(chunks);
        void (async () => {
          const parsed = await simpleParser(raw);
          const envelopeFrom = session.envelope.mailFrom ? session.envelope.mailFrom.address : '';
          await db
            .insertInto('mailbox_messages')
            .values({
              envelope_from: envelopeFrom,
              recipients: session.envelope.rcptTo.map((r) => r.address),
              subject: parsed.subject ?? '',
              text_body: parsed.text ?? '',
              html_body: typeof parsed.html === 'string' ? parsed.html : '',
              raw: raw.toString('utf8'),
            })
            .execute();
        })().then(
          () => callback(),
          (error: unknown) => callback(error instanceof Error ? error : new Error(String(error))),
        );
      });
    },
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, host, () => resolve());
  });
  server.on('error', () => undefined);
  const address = server.server.address();
  return {
    port: typeof address === 'object' && address ? address.port : port,
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}
