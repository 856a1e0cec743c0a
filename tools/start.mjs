#!/usr/bin/env node
// `npm start`: install what is missing, start PostgreSQL on loopback, migrate, seed, build, serve.
import { spawn } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { ensureDependencies, ng, nodeScript, projectRoot, projectTmpDir, say, startServer, waitForHealth } from './lib/process.mjs';

async function main() {
  process.env.TMPDIR ??= projectTmpDir();
  ensureDependencies();
  const db = await import('./db.mjs');
  // With DATABASE_URL set the database is someone else's: neither started nor stopped here.
  const external = Boolean(process.env.DATABASE_URL);
  const cluster = external ? null : db.startCluster();
  const stopCluster = () => {
    if (!external) db.stopCluster();
  };
  const env = { ...process.env, DATABASE_URL: process.env.DATABASE_URL ?? cluster.url };

  if (nodeScript('tools/migrate.ts', [], env) !== 0) throw new Error('migrations failed');
  if (nodeScript('tools/seed.ts', [], env) !== 0) throw new Error('seeding the demo failed');
  say('start', 'building the web app...');
  if (ng(['build'], env) !== 0) throw new Error('the web app did not build');

  const port = Number(process.env.PORT ?? 4200);
  const host = process.env.HOST ?? '127.0.0.1';
  const url = `http://${host}:${port}`;
  // The local mail catcher, unless SMTP_URL points at a real mail server.
  const catcher = process.env.SMTP_URL ? null : spawn(process.execPath, ['--import', 'tsx', 'tools/mail-catcher.ts'], { cwd: projectRoot, stdio: 'inherit', env });
  const server = startServer({ ...env, PORT: String(port), HOST: host });
  let stopping = false;
  const stop = (code) => {
    if (stopping) return;
    stopping = true;
    catcher?.kill('SIGTERM');
    server.kill('SIGTERM');
    server.once('exit', () => {
      stopCluster();
      process.exit(code);
    });
  };
  process.on('SIGINT', () => stop(0));
  process.on('SIGTERM', () => stop(0));
  server.on('exit', (code) => {
    if (!stopping) {
      stopCluster();
      process.exit(code ?? 1);
    }
  });

  await waitForHealth(url, server);
  const { defaultDemoPassword } = JSON.parse(readFileSync(new URL('./seed/demo-password.json', import.meta.url), 'utf8'));
  const password = process.env.DEMO_PASSWORD || defaultDemoPassword;
  process.stdout.write(
    [
      '',
      '  Quietbridge is running.',
      `  Open            ${url}`,
      `  API reference   ${url}/api/docs`,
      `  Mail            ${process.env.SMTP_URL ? 'sent through SMTP_URL' : `caught on smtp://127.0.0.1:${process.env.MAIL_CATCHER_PORT ?? 2525}; admins read it on the Mailbox page`}`,
      `  Database        ${cluster ? `${cluster.url} (data in ${cluster.dataDir})` : 'DATABASE_URL (external)'}`,
      '',
      '  Demo accounts (password for all three):',
      `    admin@example.com      administrator   ${password}`,
      `    designer@example.com   designer        ${password}`,
      `    reviewer@example.com   reviewer        ${password}`,
      '',
      '  Press Ctrl+C to stop the server and the database.',
      '',
    ].join('\n'),
  );
}

main().catch((error) => {
  process.stderr.write(`[start] ${error instanceof Error ? error.message : String(error)}\n`);
  process.exit(1);
});
