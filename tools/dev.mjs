#!/usr/bin/env node
// `npm run dev`: the database, the API in watch mode on API_PORT (3000) and `ng serve` on 4200,
// which proxies /api to the API (proxy.conf.json).
import { spawn } from 'node:child_process';
import { join } from 'node:path';
import { ensureDependencies, nodeScript, projectRoot, projectTmpDir, say, startServer } from './lib/process.mjs';

async function main() {
  process.env.TMPDIR ??= projectTmpDir();
  ensureDependencies();
  const { startCluster, stopCluster } = await import('./db.mjs');
  const cluster = startCluster();
  const env = { ...process.env, DATABASE_URL: process.env.DATABASE_URL ?? cluster.url };
  if (nodeScript('tools/migrate.ts', [], env) !== 0) throw new Error('migrations failed');
  if (nodeScript('tools/seed.ts', [], env) !== 0) throw new Error('seeding the demo failed');

  const catcher = process.env.SMTP_URL ? null : spawn(process.execPath, ['--import', 'tsx', 'tools/mail-catcher.ts'], { cwd: projectRoot, stdio: 'inherit', env });
  const api = startServer({ ...env, PORT: process.env.API_PORT ?? '3000', HOST: '127.0.0.1' }, { watch: true });
  const web = spawn(process.execPath, [join(projectRoot, 'node_modules', '@angular', 'cli', 'bin', 'ng.js'), 'serve', '--host', '127.0.0.1', '--port', '4200'], {
    cwd: projectRoot,
    stdio: 'inherit',
    env,
  });
  say('dev', 'web app on http://127.0.0.1:4200 (reloads on change), API on http://127.0.0.1:3000 (restarts on change)');
  const stop = () => {
    catcher?.kill('SIGTERM');
    api.kill('SIGTERM');
    web.kill('SIGTERM');
    stopCluster();
    process.exit(0);
  };
  process.on('SIGINT', stop);
  process.on('SIGTERM', stop);
}

main().catch((error) => {
  process.stderr.write(`[dev] ${error instanceof Error ? error.message : String(error)}\n`);
  process.exit(1);
});
