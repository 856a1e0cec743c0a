// Starts the API and the built app on HOST:PORT. Everything else lives in createApp().
import { createApp } from './app';
import { ConfigError, loadConfig } from './config';
import { createDatabase } from './db/database';
import { createLogger } from './logger';
import { createOutbox, createSmtpTransport } from './mail/outbox';
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
const db = createDatabase(config.databaseUrl);
const outbox = createOutbox({ db, transport: createSmtpTransport(config.mail.smtpUrl), from: config.mail.from, logger });
outbox.start();
const app = createApp({ config, db, logger, version, outbox });
const server = app.listen(config.port, config.host, () => {
  logger.info({ url: `http://${config.host}:${config.port}` }, 'Quietbridge is serving');
});
server.on('error', (error) => {
  logger.fatal({ err: error }, 'cannot listen');
  process.exit(1);
});

function shutDown(signal: string) {
  logger.info({ signal }, 'shutting down: finishing requests in flight');
  server.close(() => {
    void outbox
      .stop()
      .then(() => db.destroy())
      .finally(() => process.exit(0));
  });
  server.closeIdleConnections();
  setTimeout(() => process.exit(1), 10_000).unref();
}
process.on('SIGTERM', () => shutDown('SIGTERM'));
process.on('SIGINT', () => shutDown('SIGINT'));
