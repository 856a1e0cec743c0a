/**
 * Long outage run (a script, not a test; the short versions are in test/integration/faults.test.ts):
 * the API as its own process on its own PostgreSQL cluster, under a steady load of writers saving
 * versions (rebasing on 409 and saving again) and readers listing designs and loading versions,
 * while the database goes through, one after the other:
 *   a fast stop for OUTAGE_DOWN_S (10 s), a freeze (SIGSTOP of every server process, connections
 *   left open) for OUTAGE_FREEZE_S (8 s), and a crash (SIGKILL) with crash recovery at the restart,
 * with OUTAGE_STEADY_S (15 s) of normal running before, between and after.
 * Reported per phase: requests, answers by status, p50/p99/max latency; per fault: how long after
 * the database was back the first request succeeded. Checked (exit 1 when one fails): no answer but
 * 2xx, 409 and 503 (with a JSON problem); no request left without an answer for 20 s; the first
 * success within 5 s of the database's return; every acknowledged save stored exactly once, with
 * its own document.
 *
 * Run: node --import tsx tools/bench/outage.ts   (OUTAGE_PGPORT, default 54358; OUTAGE_WRITERS,
 * default 8; OUTAGE_READERS, default 8). Everything it starts is stopped and removed at the end.
 */
import { execFileSync } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import bcrypt from 'bcryptjs';
import pg from 'pg';
import demoPressure from '../../shared/examples/demo-pressure.json';
import { outageDatabase } from './cluster.mjs';
import { freePort, projectRoot, runBounded, startScript, stopScripts, waitForHttp } from './processes';

const PGPORT = Number(process.env.OUTAGE_PGPORT ?? 54358);
const WRITERS = Number(process.env.OUTAGE_WRITERS ?? 8);
const READERS = Number(process.env.OUTAGE_READERS ?? 8);
const STEADY_S = Number(process.env.OUTAGE_STEADY_S ?? 15);
const DOWN_S = Number(process.env.OUTAGE_DOWN_S ?? 10);
const FREEZE_S = Number(process.env.OUTAGE_FREEZE_S ?? 8);
const REQUEST_TIMEOUT_MS = 20_000;
const RECOVERY_TARGET_MS = 5_000;
const DEADLINE_MS = (4 * STEADY_S + DOWN_S + FREEZE_S + 300) * 1000;
const PASSWORD = 'outage-run-password-4711';

type Phase = 'steady before' | 'database stopped' | 'steady after stop' | 'database frozen' | 'steady after freeze' | 'database crashed' | 'steady after crash';

interface Outcome {
  phase: Phase;
  kind: 'save' | 'list' | 'load';
  status: number;
  ms: number;
  ended: number;
  problem: boolean;
}

const database = outageDatabase(PGPORT);
let created = false;
let phase: Phase = 'steady before';
let running = true;
const outcomes: Outcome[] = [];
const acknowledged: { designId: string; number: number; marker: string }[] = [];
const failures: string[] = [];

function say(message: string) {
  process.stdout.write(`[outage] ${message}\n`);
}

const sleep = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

async function main() {
  say(`PostgreSQL on 127.0.0.1:${PGPORT}`);
  database.create();
  created = true;
  const env = { DATABASE_URL: database.url, LOG_LEVEL: 'error' };
  execFileSync(process.execPath, ['--import', 'tsx', 'tools/migrate.ts'], { cwd: projectRoot, env: { ...process.env, ...env }, stdio: 'ignore' });
  const setup = new pg.Client({ connectionString: database.url });
  await setup.connect();
  await setup.query(`insert into users (email, display_name, role, password_hash) values ('outage@example.com', 'Outage run', 'designer', $1)`, [bcrypt.hashSync(PASSWORD, 10)]);
  await setup.end();

  const [port, smtpPort] = [await freePort(), await freePort()];
  const api = startScript('api', 'api/main.ts', {
    ...env,
    NODE_ENV: 'production',
    SESSION_SECRET: randomBytes(48).toString('base64url'),
    HOST: '127.0.0.1',
    PORT: String(port),
    STATIC_DIR: 'no-static-dir-for-the-outage-run',
    SMTP_URL: `smtp://127.0.0.1:${smtpPort}`,
  });
  const url = `http://127.0.0.1:${port}`;
  await waitForHttp(`${url}/api/health`, api);
  const signIn = await fetch(`${url}/api/auth/sign-in`, { method: 'POST', headers: { 'Content-Type': 'application/json' }, body: JSON.stringify({ email: 'outage@example.com', password: PASSWORD }) });
  const { token } = (await signIn.json()) as { token: string };
  const auth = { Authorization: `Bearer ${token}` };

  async function send(kind: Outcome['kind'], method: string, path: string, body?: unknown) {
    const startedIn = phase;
    const started = performance.now();
    try {
      const response = await fetch(`${url}${path}`, {
        method,
        headers: { ...auth, ...(body === undefined ? {} : { 'Content-Type': 'application/json' }) },
        body: body === undefined ? undefined : JSON.stringify(body),
        signal: AbortSignal.timeout(REQUEST_TIMEOUT_MS),
      });
      const text = await response.text();
      const json = text.length > 0 && /json/.test(response.headers.get('content-type') ?? '') ? (JSON.parse(text) as Record<string, unknown>) : {};
      const ended = performance.now();
      outcomes.push({ phase: startedIn, kind, status: response.status, ms: ended - started, ended, problem: typeof json['title'] === 'string' });
      return { status: response.status, body: json };
    } catch (error) {
      const ended = performance.now();
      outcomes.push({ phase: startedIn, kind, status: 0, ms: ended - started, ended, problem: false });
      failures.push(`${kind} started while "${startedIn}" got no answer within ${REQUEST_TIMEOUT_MS / 1000} s or lost its connection: ${String((error as Error).cause ?? error)}`);
      return { status: 0, body: {} as Record<string, unknown> };
    }
  }

  const designIds: string[] = [];
  for (let i = 0; i < WRITERS; i += 1) {
    const made = await send('save', 'POST', '/api/designs', { name: `Outage run ${i}`, document: demoPressure });
    if (made.status !== 201) throw new Error(`creating design ${i} answered ${made.status}`);
    designIds.push(made.body['id'] as string);
  }
  outcomes.length = 0;

  const writer = async (designId: string, index: number) => {
    let base = 1;
    let attempt = 0;
    while (running) {
      // Every attempt its own marker: a retried save is a new document, so a marker stored twice is a fault.
      const marker = `w${index}-a${attempt++}`;
      const saved = await send('save', 'POST', `/api/designs/${designId}/versions`, { document: { ...demoPressure, notes: marker }, message: marker, baseVersion: base });
      if (saved.status === 201) {
        base = saved.body['number'] as number;
        acknowledged.push({ designId, number: base, marker });
      } else if (saved.status === 409 && typeof saved.body['latestVersion'] === 'number') {
        // Answered by a save whose reply was lost in an outage: rebase on what is stored.
        base = saved.body['latestVersion'] as number;
      } else {
        await sleep(100);
      }
    }
  };
  const reader = async (index: number) => {
    while (running) {
      const answer = index % 2 === 0
        ? await send('list', 'GET', '/api/designs?page=0&pageSize=20&sort=updatedAt&order=desc&archived=false')
        : await send('load', 'GET', `/api/designs/${designIds[index % designIds.length]!}/versions/1`);
      if (answer.status !== 200) await sleep(100);
    }
  };
  const load = [...designIds.map(writer), ...Array.from({ length: READERS }, (_, i) => reader(i))];

  const returns: { fault: string; back: number }[] = [];
  const enter = (next: Phase) => {
    phase = next;
    say(next);
  };
  enter('steady before');
  await sleep(STEADY_S * 1000);

  enter('database stopped');
  database.stop();
  await sleep(DOWN_S * 1000);
  database.start();
  returns.push({ fault: 'stop', back: performance.now() });
  enter('steady after stop');
  await sleep(STEADY_S * 1000);

  enter('database frozen');
  const frozen = database.freeze();
  await sleep(FREEZE_S * 1000);
  database.thaw(frozen);
  returns.push({ fault: 'freeze', back: performance.now() });
  enter('steady after freeze');
  await sleep(STEADY_S * 1000);

  enter('database crashed');
  database.crash();
  await sleep(2000);
  database.start();
  returns.push({ fault: 'crash', back: performance.now() });
  enter('steady after crash');
  await sleep(STEADY_S * 1000);

  running = false;
  await Promise.all(load);

  report(returns);
  await verifySaves();
}

function percentile(sorted: number[], p: number): number {
  if (sorted.length === 0) return NaN;
  return sorted[Math.min(sorted.length - 1, Math.floor((p / 100) * sorted.length))]!;
}

function report(returns: { fault: string; back: number }[]) {
  const phases: Phase[] = ['steady before', 'database stopped', 'steady after stop', 'database frozen', 'steady after freeze', 'database crashed', 'steady after crash'];
  const lines = ['', 'phase                  requests  2xx     409     503     other   p50 ms  p99 ms  max ms'];
  for (const name of phases) {
    const rows = outcomes.filter((o) => o.phase === name);
    const ms = rows.map((o) => o.ms).sort((a, b) => a - b);
    const count = (test: (status: number) => boolean) => String(rows.filter((o) => test(o.status)).length).padStart(7);
    lines.push(
      [name.padEnd(22), String(rows.length).padStart(8), count((s) => s >= 200 && s < 300), count((s) => s === 409), count((s) => s === 503),
        count((s) => !(s >= 200 && s < 300) && s !== 409 && s !== 503), percentile(ms, 50).toFixed(0).padStart(7), percentile(ms, 99).toFixed(0).padStart(7), (ms.at(-1) ?? NaN).toFixed(0).padStart(7)].join(' '),
    );
  }
  for (const outcome of outcomes) {
    if (outcome.status !== 0 && !(outcome.status >= 200 && outcome.status < 300) && outcome.status !== 409 && outcome.status !== 503) {
      failures.push(`${outcome.kind} during "${outcome.phase}" answered ${outcome.status}`);
    }
    if (outcome.status === 503 && !outcome.problem) failures.push(`a 503 during "${outcome.phase}" came without a JSON problem`);
  }
  lines.push('');
  for (const { fault, back } of returns) {
    const first = outcomes.filter((o) => o.ended > back && o.status >= 200 && o.status < 300).sort((a, b) => a.ended - b.ended)[0];
    const after = first ? first.ended - back : Infinity;
    lines.push(`after the ${fault}: first success ${Number.isFinite(after) ? `${after.toFixed(0)} ms` : 'never'} after the database was back (target < ${RECOVERY_TARGET_MS} ms)`);
    if (!(after < RECOVERY_TARGET_MS)) failures.push(`after the ${fault}, the first success came ${after.toFixed(0)} ms after the database was back`);
  }
  process.stdout.write(`${lines.join('\n')}\n`);
}

async function verifySaves() {
  const client = new pg.Client({ connectionString: database.url });
  await client.connect();
  try {
    const { rows } = await client.query<{ design_id: string; number: number; message: string; notes: string }>(
      `select design_id, number, message, document->>'notes' as notes from design_versions where number > 1`,
    );
    const stored = new Map(rows.map((row) => [`${row.design_id}/${row.number}`, row]));
    let missing = 0;
    let mixed = 0;
    for (const ack of acknowledged) {
      const row = stored.get(`${ack.designId}/${ack.number}`);
      if (!row) missing += 1;
      else if (row.message !== ack.marker || row.notes !== ack.marker) mixed += 1;
    }
    const markers = rows.map((row) => row.message);
    const repeated = markers.length - new Set(markers).size;
    say(`saves acknowledged: ${acknowledged.length}; stored: ${rows.length}; acknowledged but missing: ${missing}; stored with another's document: ${mixed}; stored twice: ${repeated}`);
    if (missing > 0) failures.push(`${missing} acknowledged saves are missing`);
    if (mixed > 0) failures.push(`${mixed} saves hold another save's document`);
    if (repeated > 0) failures.push(`${repeated} saves are stored twice`);
  } finally {
    await client.end();
  }
}

async function cleanUp() {
  running = false;
  await stopScripts();
  if (created) {
    database.remove();
    created = false;
  }
}

await runBounded('outage', DEADLINE_MS, async () => {
  await main();
  if (failures.length > 0) {
    process.stdout.write(`\n${failures.length} check(s) failed:\n${[...new Set(failures)].slice(0, 20).map((f) => `  - ${f}`).join('\n')}\n`);
    process.exitCode = 1;
  } else {
    process.stdout.write('\nevery check passed\n');
  }
}, cleanUp);
