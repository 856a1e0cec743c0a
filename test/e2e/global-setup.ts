// End-to-end setup: a migrated and seeded throwaway database (or the caller's), and the real server
// serving the built app on a free loopback port. The suites find it in E2E_BASE_URL.
import { execFileSync, spawn, type ChildProcess } from 'node:child_process';
import { existsSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { startTestDatabase, stopTestDatabase } from '../support/test-database.mjs';
import { freePort, waitForHealth } from '../../tools/lib/process.mjs';

const projectRoot = fileURLToPath(new URL('../..', import.meta.url));

export default async function setup(): Promise<() => Promise<void>> {
  if (!existsSync(`${projectRoot}dist/quietbridge/browser/index.html`)) {
    throw new Error('The web app is not built: run `npx ng build` first (npm test does it for you).');
  }
  const ownCluster = !process.env.TEST_DATABASE_URL;
  const databaseUrl = process.env.TEST_DATABASE_URL ?? startTestDatabase();
  const env = { ...process.env, DATABASE_URL: databaseUrl, NODE_ENV: 'test', BCRYPT_COST: '10', LOG_LEVEL: 'warn' };
  for (const script of ['tools/migrate.ts', 'tools/seed.ts']) {
    execFileSync(process.execPath, ['--import', 'tsx', script], { cwd: projectRoot, env, stdio: 'inherit' });
  }
  const port = await freePort();
  const mailPort = await freePort();
  const baseUrl = `http://127.0.0.1:${port}`;
  // The mail catcher the suites read links from (the reviewer's invitation, for example).
  const catcher: ChildProcess = spawn(process.execPath, ['--import', 'tsx', 'tools/mail-catcher.ts'], {
    cwd: projectRoot,
    env: { ...env, MAIL_CATCHER_PORT: String(mailPort) },
    stdio: 'inherit',
  });
  const server: ChildProcess = spawn(process.execPath, ['--import', 'tsx', 'api/main.ts'], {
    cwd: projectRoot,
    env: { ...env, PORT: String(port), HOST: '127.0.0.1', SESSION_SECRET: 'end-to-end-secret-that-is-long-enough-42', MAIL_CATCHER_PORT: String(mailPort), SIGN_IN_LIMIT_PER_ADDRESS: '1000' },
    stdio: 'inherit',
  });
  await waitForHealth(baseUrl, server);
  process.env.E2E_BASE_URL = baseUrl;
  const stopChild = (child: ChildProcess) =>
    new Promise<void>((resolve) => {
      if (child.exitCode !== null) return resolve();
      child.once('exit', () => resolve());
      child.kill('SIGTERM');
    });
  return async () => {
    await stopChild(server);
    await stopChild(catcher);
    if (ownCluster) stopTestDatabase();
  };
}
