// The local mail catcher as its own process: `node --import tsx tools/mail-catcher.ts`.
// Every message sent to 127.0.0.1:MAIL_CATCHER_PORT (2525) is stored for the Mailbox page.
import { loadConfig } from '../api/config';
import { createDatabase } from '../api/db/database';
import { startMailCatcher } from '../api/mail/catcher';

const config = loadConfig();
const db = createDatabase(config.databaseUrl, { max: 3 });
const catcher = await startMailCatcher(db, config.mail.catcherPort);
process.stdout.write(`[mail] catching mail on smtp://127.0.0.1:${catcher.port}\n`);

async function stop() {
  await catcher.close();
  await db.destroy();
  process.exit(0);
}
process.on('SIGTERM', () => void stop());
process.on('SIGINT', () => void stop());
