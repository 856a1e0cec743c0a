/**
 * Load benchmark of the API (not a timed test): autocannon against the real server and PostgreSQL,
 * everything on loopback, 32 connections for 20 s per route, each after 5 s of unmeasured warm-up:
 *   sign-in, list designs (the first page as the Designs page asks for it), load a version, save a
 *   version (each connection saves on its own design, always on the latest base), the list again
 *   while 8 more connections sign in, and, in the same run, a bare Express 5 + pg route doing the
 *   designs list query (tools/bench/load-peer.ts) as the baseline.
 * Targets: p99 under 50 ms for reads, under 100 ms for saves; the list route at least 60 % of the
 * baseline's requests per second. Sign-in is reported but has no latency target: its cost is the
 * password hash (bcrypt, cost 12 by default), by design; it runs in worker threads, which the list
 * during sign-ins shows.
 *
 * Run: node --import tsx tools/bench/load.ts
 * It starts its own cluster (BENCH_PGPORT, default 54349, folder .data/pg-bench-<port>), migrates and
 * seeds it, starts the API and the baseline on free loopback ports, and stops and removes all of it
 * at the end, also on failure or Ctrl+C, within a bounded time. BENCH_CONNECTIONS, BENCH_DURATION_S
 * and BENCH_WARMUP_S change the load, BENCH_ONLY picks phases, BENCH_PROFILE_DIR=<folder> has the
 * API write a CPU profile there.
 */
import { execFileSync } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import autocannon, { type Request, type Result } from 'autocannon';
import pg from 'pg';
import demoPressure from '../../shared/examples/demo-pressure.json';
import { removeBenchDatabase, startBenchDatabase } from './cluster.mjs';
import { freePort, projectRoot, runBounded, startScript as start, stopScripts, waitForHttp } from './processes';

const PGPORT = Number(process.env.BENCH_PGPORT ?? 54349);
const CONNECTIONS = Number(process.env.BENCH_CONNECTIONS ?? 32);
const DURATION_S = Number(process.env.BENCH_DURATION_S ?? 20);
/** When set, the API process writes a V8 CPU profile (.cpuprofile) of the whole run into this folder. */
const PROFILE_DIR = process.env.BENCH_PROFILE_DIR;
/** BENCH_ONLY=list,baseline,load,save,sign-in,list-during-sign-in (any of them) runs just those. */
const ONLY = process.env.BENCH_ONLY ? new Set(process.env.BENCH_ONLY.split(',').map((key) => key.trim())) : null;
const wanted = (key: string) => !ONLY || ONLY.has(key);
/** The list request exactly as the Designs page sends it (first page of 20, newest first). */
const LIST_PAGE_SIZE = 20;
const LIST_PATH = `/api/designs?page=0&pageSize=${LIST_PAGE_SIZE}&sort=updatedAt&order=desc&archived=false`;
/** Sign-in connections kept busy beside the list run of the last phase. */
const SIGN_IN_CONNECTIONS = 8;
const DESIGNER = 'designer@example.com';
const PASSWORD = process.env.DEMO_PASSWORD || 'bridge-demo-2026';
/** The whole run may take no longer than this; then everything is stopped. */
const DEADLINE_MS = (7 * (DURATION_S + Number(process.env.BENCH_WARMUP_S ?? 5)) + 300) * 1000;

let databaseStarted = false;

function say(message: string) {
  process.stdout.write(`[load] ${message}\n`);
}

/** Waits until the server answers a health check quickly again (work queued by a run is done). */
async function drained(url: string) {
  const deadline = Date.now() + 60_000;
  while (Date.now() < deadline) {
    const started = performance.now();
    await fetch(`${url}/api/health`);
    if (performance.now() - started < 20) return;
    await new Promise((resolve) => setTimeout(resolve, 200));
  }
  throw new Error('the server stayed busy for a minute after a run');
}

async function cleanUp() {
  await stopScripts();
  if (databaseStarted) {
    removeBenchDatabase(PGPORT);
    databaseStarted = false;
  }
}

async function json<T>(response: Response): Promise<T> {
  if (!response.ok) throw new Error(`${response.url}: ${response.status} ${await response.text()}`);
  return (await response.json()) as T;
}

/** Each route first runs unmeasured for this long, so the figures are of a warmed-up process (JIT, pools, caches). */
const WARM_UP_S = Number(process.env.BENCH_WARMUP_S ?? 5);

let databaseUrl = '';

/**
 * Each phase starts on a settled database: statistics fresh and dirty pages written, so no
 * autovacuum or checkpoint set off by the previous phase's writes runs in the middle of this one.
 */
async function settle() {
  const client = new pg.Client({ connectionString: databaseUrl });
  await client.connect();
  try {
    await client.query('vacuum (analyze)');
    await client.query('checkpoint');
  } finally {
    await client.end();
  }
}

async function run(title: string, url: string, requests: Request[], afterWarmUp?: () => Promise<void>, timeout = 10): Promise<Result> {
  await settle();
  if (WARM_UP_S > 0) {
    say(`${title}: warming up for ${WARM_UP_S} s`);
    await autocannon({ url, connections: CONNECTIONS, duration: WARM_UP_S, timeout, requests });
    await drained(url);
    await afterWarmUp?.();
  }
  say(`${title}: ${CONNECTIONS} connections for ${DURATION_S} s`);
  return autocannon({ url, connections: CONNECTIONS, duration: DURATION_S, timeout, requests });
}

interface Row {
  route: string;
  result: Result;
  p99Target: number | null;
}

function report(rows: Row[], baseline: Result | null) {
  const lines = ['', 'route                      req/s    p50 ms   p99 ms   2xx      non-2xx  errors   p99 target'];
  for (const { route, result, p99Target } of rows) {
    const verdict = p99Target === null ? 'none' : `< ${p99Target} ms ${result.latency.p99 < p99Target ? 'ok' : 'MISSED'}`;
    lines.push(
      [route.padEnd(26), result.requests.average.toFixed(0).padStart(6), result.latency.p50.toFixed(1).padStart(9), result.latency.p99.toFixed(1).padStart(8),
        String(result['2xx']).padStart(8), String(result.non2xx).padStart(8), String(result.errors + result.timeouts).padStart(8), `   ${verdict}`].join(' '),
    );
  }
  const list = rows.find((row) => row.route === 'list designs')?.result;
  if (!baseline || !list) {
    process.stdout.write(`${lines.join('\n')}\n`);
    return;
  }
  const ratio = list.requests.average / baseline.requests.average;
  lines.push(
    [ 'baseline (Express + pg)'.padEnd(26), baseline.requests.average.toFixed(0).padStart(6), baseline.latency.p50.toFixed(1).padStart(9), baseline.latency.p99.toFixed(1).padStart(8),
      String(baseline['2xx']).padStart(8), String(baseline.non2xx).padStart(8), String(baseline.errors + baseline.timeouts).padStart(8)].join(' '),
  );
  lines.push('', `list designs / baseline: ${(100 * ratio).toFixed(0)} % of the baseline's requests per second (target >= 60 %) ${ratio >= 0.6 ? 'ok' : 'MISSED'}`);
  process.stdout.write(`${lines.join('\n')}\n`);
}

async function main() {
  say(`PostgreSQL on 127.0.0.1:${PGPORT}`);
  databaseUrl = startBenchDatabase(PGPORT);
  databaseStarted = true;
  const env = { DATABASE_URL: databaseUrl, LOG_LEVEL: 'warn' };
  execFileSync(process.execPath, ['--import', 'tsx', 'tools/migrate.ts'], { cwd: projectRoot, env: { ...process.env, ...env }, stdio: 'ignore' });
  execFileSync(process.execPath, ['--import', 'tsx', 'tools/seed.ts'], { cwd: projectRoot, env: { ...process.env, ...env }, stdio: 'ignore' });

  const [apiPort, peerPort, smtpPort] = [await freePort(), await freePort(), await freePort()];
  const api = start('api', 'api/main.ts', {
    ...env,
    NODE_ENV: 'production',
    SESSION_SECRET: randomBytes(48).toString('base64url'),
    HOST: '127.0.0.1',
    PORT: String(apiPort),
    STATIC_DIR: 'no-static-dir-for-the-load-benchmark',
    SMTP_URL: `smtp://127.0.0.1:${smtpPort}`,
    SIGN_IN_LIMIT_PER_ADDRESS: '100000000',
    SIGN_IN_LIMIT_PER_ACCOUNT: '100000000',
  }, [...(process.env.BENCH_API_NODE_ARGS?.split(' ').filter(Boolean) ?? []), ...(PROFILE_DIR ? ['--cpu-prof', `--cpu-prof-dir=${PROFILE_DIR}`] : [])]);
  const apiUrl = `http://127.0.0.1:${apiPort}`;
  await waitForHttp(`${apiUrl}/api/health`, api);

  const session = await json<{ token: string; user: { id: string } }>(
    await fetch(`${apiUrl}/api/auth/sign-in`, { method: 'POST', headers: { 'Content-Type': 'application/json' }, body: JSON.stringify({ email: DESIGNER, password: PASSWORD }) }),
  );
  const auth = { Authorization: `Bearer ${session.token}` };
  const designs = await json<{ items: { id: string; name: string; latestVersion: number }[] }>(await fetch(`${apiUrl}/api/designs`, { headers: auth }));
  const demo = designs.items.find((d) => d.name === 'Dispensing robot line sensor, pressure');
  if (!demo) throw new Error('the seeded demo design is missing');
  // Saves go round a pool of designs four times the connections, skipping any whose last save is
  // unanswered, so every save is on the latest version. (autocannon resets a connection's context on
  // every request when there is only one, so state cannot live there.)
  const latest = new Map<string, number>();
  for (let i = 0; i < 4 * CONNECTIONS; i += 1) {
    const created = await json<{ id: string }>(
      await fetch(`${apiUrl}/api/designs`, { method: 'POST', headers: { ...auth, 'Content-Type': 'application/json' }, body: JSON.stringify({ name: `Load benchmark ${i}`, document: demoPressure }) }),
    );
    latest.set(created.id, 1);
  }
  const savePool = [...latest.keys()];

  const peer = start('baseline', 'tools/bench/load-peer.ts', { ...env, PORT: String(peerPort), OWNER_ID: session.user.id, PAGE_SIZE: String(LIST_PAGE_SIZE) });
  const peerUrl = `http://127.0.0.1:${peerPort}`;
  await waitForHttp(`${peerUrl}/designs`, peer);

  const rows: Row[] = [];
  if (wanted('list')) rows.push({ route: 'list designs', p99Target: 50, result: await run('list designs', apiUrl, [{ method: 'GET', path: LIST_PATH, headers: auth }]) });
  await drained(apiUrl);
  const baseline = wanted('baseline') ? await run('baseline: Express + pg, the list query', peerUrl, [{ method: 'GET', path: '/designs' }]) : null;
  await drained(apiUrl);
  if (wanted('load')) rows.push({ route: 'load a version', p99Target: 50, result: await run('load a version', apiUrl, [{ method: 'GET', path: `/api/designs/${demo.id}/versions/${demo.latestVersion}`, headers: auth }]) });

  let nextDesign = 0;
  let conflicts = 0;
  // A design whose save is still unanswered is skipped, so no save is on a base that is about to go stale.
  const saving = new Set<string>();
  const save: Request = {
    method: 'POST',
    setupRequest: (request) => {
      let id = savePool[nextDesign++ % savePool.length]!;
      for (let tries = 0; saving.has(id) && tries < savePool.length; tries += 1) id = savePool[nextDesign++ % savePool.length]!;
      saving.add(id);
      return {
        ...request,
        path: `/api/designs/${id}/versions`,
        headers: { ...auth, 'Content-Type': 'application/json' },
        body: JSON.stringify({ document: demoPressure, message: 'Load benchmark save', baseVersion: latest.get(id) }),
      };
    },
    onResponse: (status, body) => {
      if (status === 201) {
        const saved = JSON.parse(body) as { designId: string; number: number };
        latest.set(saved.designId, saved.number);
        saving.delete(saved.designId);
      } else if (status === 409) {
        conflicts += 1;
      }
    },
  };
  await drained(apiUrl);
  // Saves whose answer the end of the warm-up cut off were still stored: start from the stored numbers.
  const refreshLatest = async () => {
    const stored = await json<{ items: { id: string; latestVersion: number }[] }>(await fetch(`${apiUrl}/api/designs?pageSize=200`, { headers: auth }));
    for (const design of stored.items) if (latest.has(design.id)) latest.set(design.id, design.latestVersion);
    conflicts = 0;
    saving.clear();
  };
  if (wanted('save')) rows.push({ route: 'save a version', p99Target: 100, result: await run('save a version', apiUrl, [save], refreshLatest) });
  if (conflicts > 0) say(`saves: ${conflicts} answered 409 (a design came round before its last save was answered)`);

  // Last, because the password hashing of the sign-ins still queued when a run ends goes on for seconds.
  await drained(apiUrl);
  const signInBody = JSON.stringify({ email: DESIGNER, password: PASSWORD });
  const signIn: Request = { method: 'POST', path: '/api/auth/sign-in', headers: { 'Content-Type': 'application/json' }, body: signInBody };
  // 32 sign-ins queue for the hashing threads for several seconds each: the timeout leaves room for that.
  if (wanted('sign-in')) rows.unshift({ route: 'sign-in', p99Target: null, result: await run('sign-in', apiUrl, [signIn], undefined, 60) });

  // Password hashing runs in worker threads: a burst of sign-ins must not hold up the reads.
  if (wanted('list-during-sign-in')) {
    await drained(apiUrl);
    await settle();
    say(`list designs while ${SIGN_IN_CONNECTIONS} connections sign in: ${CONNECTIONS} connections for ${DURATION_S} s`);
    const [during] = await Promise.all([
      autocannon({ url: apiUrl, connections: CONNECTIONS, duration: DURATION_S, timeout: 10, requests: [{ method: 'GET', path: LIST_PATH, headers: auth }] }),
      autocannon({ url: apiUrl, connections: SIGN_IN_CONNECTIONS, duration: DURATION_S, timeout: 30, requests: [signIn] }),
    ]);
    rows.push({ route: 'list during sign-ins', p99Target: null, result: during });
  }

  report(rows, baseline);
}

await runBounded('load', DEADLINE_MS, main, cleanUp);
