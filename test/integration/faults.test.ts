import { execFileSync } from 'node:child_process';
import bcrypt from 'bcryptjs';
import type { Kysely } from 'kysely';
import { pino } from 'pino';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import demoPressure from '@shared/examples/demo-pressure.json';
import { createDatabase, type Database } from '../../api/db/database';
import { startMailCatcher, type MailCatcher } from '../../api/mail/catcher';
import { createOutbox, createSmtpTransport } from '../../api/mail/outbox';
import { insertUser } from '../../api/users/user.repository';
import { freePort, startApiProcess, type ApiProcess } from '../support/api-process';
import { createFaultDatabase, freezeFaultDatabase, removeFaultDatabase, restartFaultDatabase, stopFaultDatabase, thawFaultDatabase } from '../support/fault-database.mjs';
import { sessionOf, storeDesign } from '../support/fixtures';
import { createAccount, createTestApp, resetTables, TEST_PASSWORD } from '../support/test-app';

// The API as its own process on a cluster of its own, which the test stops and starts while a load
// runs; then a graceful shutdown of that process. And the mail server away while reviews are shared.

const WRITERS = 10;
/** How long a request may take before it counts as hanging. */
const REQUEST_TIMEOUT_MS = 20_000;
/** The longest a request may wait on a database that does not answer: one connection attempt or one query. */
const DATABASE_WAIT_BOUND_MS = 7_000;

describe('PostgreSQL stopped and restarted under load', () => {
  let databaseUrl = '';
  let db: Kysely<Database>;
  let api: ApiProcess;
  let token = '';
  const designIds: string[] = [];

  beforeAll(async () => {
    databaseUrl = createFaultDatabase();
    execFileSync(process.execPath, ['--import', 'tsx', 'tools/migrate.ts'], { env: { ...process.env, DATABASE_URL: databaseUrl }, stdio: 'pipe' });
    db = createDatabase(databaseUrl, { max: 2 });
    const owner = await insertUser(db, { email: 'dana@example.com', display_name: 'Dana', role: 'designer', password_hash: await bcrypt.hash(TEST_PASSWORD, 10) });
    api = await startApiProcess(databaseUrl);
    const signedIn = await fetch(`${api.url}/api/auth/sign-in`, { method: 'POST', headers: { 'Content-Type': 'application/json' }, body: JSON.stringify({ email: owner.email, password: TEST_PASSWORD }) });
    token = ((await signedIn.json()) as { token: string }).token;
    for (let i = 0; i < WRITERS; i += 1) {
      const created = await post('/api/designs', { name: `Line sensor ${i}`, document: demoPressure });
      expect(created.status).toBe(201);
      designIds.push(created.body['id'] as string);
    }
  }, 120_000);

  afterAll(async () => {
    await api?.stop(2000);
    await db?.destroy();
    removeFaultDatabase();
  }, 60_000);

  interface Outcome {
    route: 'save' | 'list' | 'health';
    phase: 'before' | 'down' | 'restarting' | 'after';
    status: number;
    started: number;
    ended: number;
    title: string | null;
    retryAfter: string | null;
  }

  async function send(method: string, path: string, body?: unknown) {
    const response = await fetch(`${api.url}${path}`, {
      method,
      headers: { Authorization: `Bearer ${token}`, ...(body === undefined ? {} : { 'Content-Type': 'application/json' }) },
      body: body === undefined ? undefined : JSON.stringify(body),
      signal: AbortSignal.timeout(REQUEST_TIMEOUT_MS),
    });
    const json = /json/.test(response.headers.get('content-type') ?? '');
    const answer = (json ? await response.json() : (await response.arrayBuffer(), {})) as Record<string, unknown>;
    return { status: response.status, body: answer, retryAfter: response.headers.get('retry-after') };
  }
  const post = (path: string, body: unknown) => send('POST', path, body);

  it('answers 503 fast while the database is away, recovers by itself within 5 s, and keeps every acknowledged save', async () => {
    let phase: Outcome['phase'] = 'before';
    let running = true;
    const outcomes: Outcome[] = [];
    const acknowledged: { designId: string; number: number; marker: string }[] = [];

    async function timed(route: Outcome['route'], run: () => ReturnType<typeof send>) {
      const started = performance.now();
      const startedIn = phase;
      let result: Awaited<ReturnType<typeof send>>;
      try {
        result = await run();
      } catch (error) {
        // A refused connection (the process died) or a request past the timeout (a hang).
        outcomes.push({ route, phase: startedIn, status: 0, started, ended: performance.now(), title: String(error), retryAfter: null });
        return null;
      }
      outcomes.push({ route, phase: startedIn, status: result.status, started, ended: performance.now(), title: (result.body['title'] as string) ?? null, retryAfter: result.retryAfter });
      return result;
    }
    const pause = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

    async function writer(w: number) {
      const designId = designIds[w]!;
      let baseVersion = (await db.selectFrom('designs').select('latest_version').where('id', '=', designId).executeTakeFirstOrThrow()).latest_version;
      let serial = 0;
      while (running) {
        const marker = `writer-${w}-save-${(serial += 1)}`;
        const result = await timed('save', () => post(`/api/designs/${designId}/versions`, { document: { ...demoPressure, notes: marker }, message: marker, baseVersion }));
        if (result?.status === 201) {
          acknowledged.push({ designId, number: result.body['number'] as number, marker });
          baseVersion = result.body['number'] as number;
        } else if (result?.status === 409) {
          baseVersion = result.body['latestVersion'] as number;
        } else {
          await pause(50);
        }
      }
    }
    async function reader(route: 'list' | 'health') {
      while (running) {
        const result = await timed(route, () => send('GET', route === 'list' ? '/api/designs' : '/api/health'));
        if (result?.status !== 200) await pause(50);
      }
    }

    const load = [...designIds.map((_, w) => writer(w)), reader('list'), reader('list'), reader('health')];
    await pause(1500);
    stopFaultDatabase();
    phase = 'down';
    await pause(3000);
    phase = 'restarting';
    restartFaultDatabase();
    const backAt = performance.now();
    phase = 'after';
    await pause(6000);
    running = false;
    await Promise.all(load);

    // No crash, no hang: every request got an answer, and the process is still up.
    expect(outcomes.filter((o) => o.status === 0), api.output()).toEqual([]);
    expect(api.child.exitCode).toBeNull();
    const unexpected = outcomes.filter((o) => ![200, 201, 409, 503].includes(o.status));
    expect(unexpected, api.output()).toEqual([]);

    // While the database is away: a clear 503 problem for every route, quickly.
    const down = outcomes.filter((o) => o.phase === 'down');
    expect(down.length).toBeGreaterThan(20);
    for (const outcome of down) {
      expect(outcome.status, `${outcome.route} while the database is away`).toBe(503);
      if (outcome.route !== 'health') {
        expect(outcome.title).toBe('Database unavailable');
        expect(outcome.retryAfter).toBe('5');
      }
    }
    const slowest = Math.max(...down.map((o) => o.ended - o.started));
    expect(slowest, 'slowest answer while the database is away [ms]').toBeLessThan(1000);

    // Back by itself: each route answers successfully within 5 s of the database's return.
    for (const route of ['save', 'list', 'health'] as const) {
      const firstSuccess = outcomes.filter((o) => o.route === route && o.ended > backAt && (o.status === 200 || o.status === 201)).sort((a, b) => a.ended - b.ended)[0];
      expect(firstSuccess, `${route} after the restart`).toBeDefined();
      expect(firstSuccess!.ended - backAt, `${route}: time to the first success after the restart [ms]`).toBeLessThan(5000);
    }
    const phaseOf = (o: Outcome) => o.phase;
    expect(outcomes.filter((o) => o.route === 'save' && o.status === 201).map(phaseOf)).toEqual(expect.arrayContaining(['before', 'after']));

    // Every acknowledged save is stored, once, with its own document; the numbers have no gaps.
    for (const designId of designIds) {
      const stored = await db.selectFrom('design_versions').select(['number', 'message', 'document']).where('design_id', '=', designId).orderBy('number').execute();
      expect(stored.map((v) => v.number)).toEqual(stored.map((_, i) => i + 1));
      const byNumber = new Map(stored.map((v) => [v.number, v]));
      for (const ack of acknowledged.filter((a) => a.designId === designId)) {
        expect(byNumber.get(ack.number)?.message, ack.marker).toBe(ack.marker);
        expect((byNumber.get(ack.number)?.document as { notes: string }).notes).toBe(ack.marker);
      }
      expect(new Set(stored.map((v) => v.message)).size).toBe(stored.length);
    }
  }, 90_000);

  it('answers 503 within a bounded time while the database stops answering, and recovers when it answers again', async () => {
    const designId = designIds[1]!;
    const { latest_version: baseVersion } = await db.selectFrom('designs').select('latest_version').where('id', '=', designId).executeTakeFirstOrThrow();
    // Idle connections in the API's pool, so that requests meet an open connection that no longer answers.
    await Promise.all(Array.from({ length: 6 }, () => send('GET', '/api/designs')));
    const timedSend = async (method: string, path: string, body?: unknown) => {
      const started = performance.now();
      try {
        const result = await send(method, path, body);
        return { path, status: result.status, title: result.body['title'], ms: performance.now() - started };
      } catch (error) {
        return { path, status: 0, title: String(error), ms: performance.now() - started };
      }
    };
    const frozen = freezeFaultDatabase();
    let results: Awaited<ReturnType<typeof timedSend>>[];
    try {
      results = await Promise.all([
        ...Array.from({ length: 6 }, () => timedSend('GET', '/api/designs')),
        timedSend('POST', `/api/designs/${designId}/versions`, { document: demoPressure, message: 'while frozen', baseVersion }),
        timedSend('GET', `/api/designs/${designId}/versions/1`),
      ]);
    } finally {
      thawFaultDatabase(frozen);
    }
    const thawedAt = performance.now();
    for (const result of results) {
      expect(result, api.output()).toMatchObject({ status: 503, title: 'Database unavailable' });
      expect(result.ms, `${result.path} against a database that does not answer [ms]`).toBeLessThan(DATABASE_WAIT_BOUND_MS);
    }
    let recovered = false;
    while (!recovered && performance.now() - thawedAt < 5000) {
      recovered = (await send('GET', '/api/designs')).status === 200;
    }
    expect(recovered, 'answers again within 5 s of the database').toBe(true);
    expect(api.child.exitCode).toBeNull();
  }, 60_000);

  it('finishes the requests in flight at SIGTERM and exits 0', async () => {
    const designId = designIds[0]!;
    const { latest_version: baseVersion } = await db.selectFrom('designs').select('latest_version').where('id', '=', designId).executeTakeFirstOrThrow();
    const inFlight = [
      ...Array.from({ length: 4 }, () => send('GET', `/api/designs/${designId}/versions/1/report`)),
      ...Array.from({ length: 4 }, (_, i) => post(`/api/designs/${designIds[i + 1]!}/versions`, { document: { ...demoPressure, notes: `at-shutdown-${i}` }, message: `at-shutdown-${i}`, baseVersion: 1 })),
      post(`/api/designs/${designId}/versions`, { document: demoPressure, message: 'last before shutdown', baseVersion }),
    ];
    await new Promise((resolve) => setTimeout(resolve, 200));
    const signalled = performance.now();
    api.child.kill('SIGTERM');
    const settled = await Promise.allSettled(inFlight);
    const refused = settled.flatMap((outcome) => (outcome.status === 'rejected' ? [String((outcome.reason as Error).cause ?? outcome.reason)] : []));
    expect(refused, `requests in flight that got no answer; the server wrote:\n${api.output()}`).toEqual([]);
    const results = settled.map((outcome) => (outcome as PromiseFulfilledResult<Awaited<ReturnType<typeof send>>>).value);
    expect(results.slice(0, 4).map((r) => r.status)).toEqual([200, 200, 200, 200]);
    expect(results.slice(4, 8).map((r) => r.status).every((s) => s === 201 || s === 409)).toBe(true);
    expect(results[8]!.status).toBe(201);
    const answered = performance.now();
    const exit = await api.exited;
    expect(performance.now() - answered, 'from the last answer to exit [ms]').toBeLessThan(1500);
    expect(exit, api.output()).toEqual({ code: 0, signal: null });
    expect(performance.now() - signalled, 'from SIGTERM to exit [ms]').toBeLessThan(10_000);
    const last = await db.selectFrom('design_versions').select('message').where('design_id', '=', designId).where('number', '=', baseVersion + 1).executeTakeFirst();
    expect(last?.message).toBe('last before shutdown');
    await expect(fetch(`${api.url}/api/health`)).rejects.toThrow();
  }, 60_000);
});

describe('the mail server away', () => {
  it('lets shares succeed while it is down, and the running outbox sends every mail once after it is back', async () => {
    const testApp = createTestApp();
    const port = await freePort();
    let catcher: MailCatcher | null = await startMailCatcher(testApp.db, port);
    const outbox = createOutbox({ db: testApp.db, transport: createSmtpTransport(`smtp://127.0.0.1:${port}`), from: 'Quietbridge <qb@localhost>', logger: pino({ level: 'silent' }), pollMs: 200 });
    try {
      await resetTables(testApp);
      const owner = await createAccount(testApp, 'designer');
      const reviewers = await Promise.all([1, 2, 3].map((i) => createAccount(testApp, 'reviewer', `reviewer-${i}@example.com`)));
      const designId = await storeDesign(testApp, owner, 'Line sensor');
      const auth = await sessionOf(testApp, owner);
      outbox.start();

      await catcher.close();
      catcher = null;
      const shares = [];
      for (const reviewer of reviewers) {
        const share = await request(testApp.app).post(`/api/designs/${designId}/versions/1/reviews`).set(auth).send({ reviewerEmail: reviewer.email });
        expect(share.status).toBe(201);
        expect(share.body.notification).toBe('pending');
        shares.push(share.body.id as string);
      }
      const invited = await request(testApp.app).post(`/api/designs/${designId}/versions/1/reviews`).set(auth).send({ reviewerEmail: 'newcomer@example.com' });
      expect(invited.status).toBe(201);

      const waitFor = async (done: () => Promise<boolean>, ms: number) => {
        const deadline = Date.now() + ms;
        while (!(await done())) {
          if (Date.now() > deadline) return false;
          await new Promise((resolve) => setTimeout(resolve, 100));
        }
        return true;
      };
      // The outbox has tried and failed while the server is away; nothing is lost.
      expect(await waitFor(async () => (await testApp.db.selectFrom('outbox').select('id').where('attempts', '>=', 1).execute()).length === 4, 5000)).toBe(true);
      const pending = await testApp.db.selectFrom('outbox').select(['sent_at', 'last_error']).execute();
      expect(pending.every((row) => row.sent_at === null && row.last_error)).toBe(true);

      catcher = await startMailCatcher(testApp.db, port);
      expect(await waitFor(async () => (await testApp.db.selectFrom('outbox').select('id').where('sent_at', 'is', null).execute()).length === 0, 10_000)).toBe(true);
      const caught = await testApp.db.selectFrom('mailbox_messages').select('recipients').execute();
      expect(caught.map((m) => m.recipients[0]).sort()).toEqual(['newcomer@example.com', ...reviewers.map((r) => r.email)].sort());
      for (const id of shares) {
        expect((await request(testApp.app).get(`/api/reviews/${id}`).set(auth)).body.review.notification).toBe('sent');
      }
    } finally {
      await outbox.stop();
      await catcher?.close();
      await testApp.db.destroy();
    }
  }, 30_000);
});
