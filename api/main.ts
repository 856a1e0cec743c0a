// Starts the API and the built app on HOST:PORT. Everything else lives in createApp().
import { createApp } from './app';
import { closePasswordWorkers } from './auth/password-hashing';
import { SessionCache } from './auth/session-cache';
import { ConfigError, loadConfig } from './config';
import { createDatabase } from './db/database';
import { createLogger } from './logger';
import { createOutbox, createSmtpTransport } from './mail/outbox';
import { closeReportWorkers } from './reports/report-workers';
import { version } from './version';

let config;
try {
  config = loadConfig();
} catch (error) {
  if (error instanceof ConfigError) {
    process.stderr.write(`Quietbridge cannot start.\n${error.message}\n`);
    process.exit(1);
  }
  throw error;
}

const logger = createLogger(config.logLevel);
const db = createDatabase(config.databaseUrl, { prepared: true });
const outbox = createOutbox({ db, transport: createSmtpTransport(config.mail.smtpUrl), from: config.mail.from, logger });
outbox.start();
const sessions = new SessionCache(config.databaseUrl, logger);
sessions.start();
const app = createApp({ config, db, logger, version, outbox, sessions });
const server = app.listen(config.port, config.host, () => {
  logger.info({ url: `http://${config.host}:${config.port}` }, 'Quietbridge is serving');
});
server.on('error', (error) => {
  logger.fatal({ err: error }, 'cannot listen');
  process.exit(1);
});

/**
 * Requests already sent may still wait, unaccepted or unread, while the process is busy (a report
 * being drawn); close() would reset such a connection, taking it for an idle one. So before closing,
 * the server reads on for a moment and for a few turns of the event loop (each turn accepts and
 * reads what is pending), which makes those requests in flight, and close() lets them finish.
 */
const SHUTDOWN_READ_MS = 500;
const SHUTDOWN_READ_TURNS = 3;
let shuttingDown = false;

async function readPendingRequests() {
  await new Promise((resolve) => setTimeout(resolve, SHUTDOWN_READ_MS));
  for (let turn = 0; turn < SHUTDOWN_READ_TURNS; turn += 1) await new Promise((resolve) => setImmediate(resolve));
}

function shutDown(signal: string) {
  if (shuttingDown) return;
  shuttingDown = true;
  logger.info({ signal }, 'shutting down: finishing requests in flight');
  setTimeout(() => process.exit(1), 10_000).unref();
  void readPendingRequests().then(() => {
    // Connections that finish their request after close() would otherwise linger for the keep-alive timeout.
    const sweep = setInterval(() => server.closeIdleConnections(), 100);
    server.close(() => {
      clearInterval(sweep);
      void outbox
        .stop()
        .then(() => Promise.all([sessions.stop(), db.destroy(), closePasswordWorkers(), closeReportWorkers()]))
        .finally(() => process.exit(0));
    });
  });
}
process.on('SIGTERM', () => shutDown('SIGTERM'));
process.on('SIGINT', () => shutDown('SIGINT'));
