import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { pino } from 'pino';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { MAX_DATASET_BYTES } from '@shared/contracts/calibration';
import { createApp, operations } from '../../api/app';
import { loadConfig } from '../../api/config';
import { createDatabase } from '../../api/db/database';
import { createInvitation } from '../../api/reviews/invitation.service';
import { sessionOf, storeDesign } from '../support/fixtures';
import { createAccount, createTestApp, resetTables, signIn, TEST_PASSWORD } from '../support/test-app';

const projectRoot = fileURLToPath(new URL('../..', import.meta.url));
const builtApp = path.join(projectRoot, 'dist', 'quietbridge', 'browser');
const testApp = createTestApp();
const { app } = testApp;
const uuid = '00000000-0000-4000-8000-000000000000';
const concretePath = (template: string) => template.replace(/\{(\w+)\}/g, (_m, name: string) => (name === 'number' ? '1' : name === 'token' ? 'x'.repeat(43) : uuid));
type Method = 'get' | 'post' | 'patch' | 'put' | 'delete';

afterAll(async () => {
  await testApp.db.destroy();
});

/** The directives of a Content-Security-Policy header by name. */
function directives(csp: string): Record<string, string[]> {
  return Object.fromEntries(
    csp
      .split(';')
      .map((part) => part.trim().split(/\s+/))
      .filter((words) => words[0])
      .map(([name, ...values]) => [name!, values]),
  );
}

/** What in a page the policy (script-src 'self', script-src-attr 'none') would block. */
function cspViolations(html: string): string[] {
  const found: string[] = [];
  for (const match of html.matchAll(/<script\b([^>]*)>([\s\S]*?)<\/script>/gi)) {
    const [, attributes, body] = match;
    if (!/\bsrc\s*=/.test(attributes!)) found.push(`inline script: ${body!.slice(0, 60)}`);
    else if (/\bsrc\s*=\s*["']?(https?:)?\/\//i.test(attributes!)) found.push(`script from another host: ${attributes}`);
  }
  for (const match of html.matchAll(/<[a-z][^>]*\s(on[a-z]+)\s*=/gi)) found.push(`inline event handler: ${match[1]}`);
  for (const match of html.matchAll(/\b(?:href|src)\s*=\s*["']?(javascript:|https?:\/\/)[^"'\s>]*/gi)) found.push(`URL the policy refuses: ${match[0]}`);
  return found;
}

describe('Content-Security-Policy', () => {
  it('serves the app’s index.html with a policy that allows no inline script and nothing from other hosts', async () => {
    const dir = mkdtempSync(path.join(tmpdir(), 'qb-static-'));
    try {
      writeFileSync(path.join(dir, 'index.html'), '<!doctype html><title>Quietbridge</title><script src="main.js" type="module"></script>');
      const spa = createApp({ config: { ...testApp.config, staticDir: dir }, db: testApp.db, logger: pino({ level: 'silent' }), version: 'test' });
      for (const url of ['/', '/designs/42']) {
        const page = await request(spa).get(url);
        expect(page.status).toBe(200);
        const policy = directives(page.headers['content-security-policy']);
        expect(policy['script-src']).toEqual(["'self'"]);
        expect(policy['script-src-attr']).toEqual(["'none'"]);
        expect(policy['default-src']).toEqual(["'self'"]);
        expect(policy['object-src']).toEqual(["'none'"]);
        expect(policy['frame-ancestors']).toEqual(["'none'"]);
        expect(policy['connect-src']).toEqual(["'self'"]);
        for (const values of Object.values(policy)) expect(values.some((v) => /^https?:|^\*$/.test(v))).toBe(false);
        expect(page.headers['x-frame-options']).toBe('SAMEORIGIN');
      }
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });

  it('builds the app without critical-CSS inlining, whose onload handler that policy would block', () => {
    const angular = JSON.parse(readFileSync(path.join(projectRoot, 'angular.json'), 'utf8'));
    const production = Object.values(angular.projects as Record<string, { architect: { build: { configurations: { production: { optimization: unknown } } } } }>)[0]!.architect.build.configurations.production;
    expect(production.optimization).toMatchObject({ styles: { inlineCritical: false } });
    expect(cspViolations('<link rel="stylesheet" href="styles.css" media="print" onload="this.media=\'all\'">')).toEqual(['inline event handler: onload']);
    expect(cspViolations('<script>window.x = 1</script><script src="https://cdn.example.com/a.js"></script>')).toEqual([
      'inline script: window.x = 1',
      'script from another host:  src="https://cdn.example.com/a.js"',
      'URL the policy refuses: src="https://cdn.example.com/a.js',
    ]);
  });

  it('finds nothing in the built index.html that the policy would block', async () => {
    const spa = createApp({ config: { ...testApp.config, staticDir: builtApp }, db: testApp.db, logger: pino({ level: 'silent' }), version: 'test' });
    const page = await request(spa).get('/');
    expect(page.status).toBe(200);
    expect(page.text).toContain('<script src="main-');
    expect(cspViolations(page.text)).toEqual([]);
  });
});

describe('transport and cookies', () => {
  it('sends HSTS only when cookies are secure (served over TLS)', async () => {
    const secure = createApp({ config: { ...testApp.config, cookieSecure: true }, db: testApp.db, logger: pino({ level: 'silent' }), version: 'test' });
    expect((await request(secure).get('/api/health')).headers['strict-transport-security']).toMatch(/max-age=\d{7,}/);
    expect((await request(app).get('/api/health')).headers['strict-transport-security']).toBeUndefined();
  });

  it('tells browsers and proxies to store no API answer, on success and on error', async () => {
    const owner = await createAccount(testApp, 'designer');
    const auth = await sessionOf(testApp, owner);
    const answers = {
      'GET /api/designs': await request(app).get('/api/designs').set(auth),
      'GET /api/auth/me': await request(app).get('/api/auth/me').set(auth),
      'GET /api/designs signed out': await request(app).get('/api/designs'),
      'GET /api/designs/{id} unknown': await request(app).get(`/api/designs/${uuid}`).set(auth),
      'POST /api/auth/sign-in wrong': await request(app).post('/api/auth/sign-in').send({ email: 'nobody@example.com', password: 'wrong-password-1' }),
    };
    for (const [what, response] of Object.entries(answers)) {
      expect(response.headers['cache-control'], what).toBe('no-store');
      expect(response.headers['etag']).toBeUndefined();
    }
  });

  it('sets the session cookie httpOnly, SameSite=Strict and Secure over TLS, at sign-in and at invitation sign-up', async () => {
    await resetTables(testApp);
    const secureApp = createTestApp({ cookieSecure: true });
    try {
      const user = await createAccount(secureApp, 'designer');
      const signedIn = await request(secureApp.app).post('/api/auth/sign-in').send({ email: user.email, password: TEST_PASSWORD });
      const { token } = await secureApp.db.transaction().execute((trx) => createInvitation(trx, 'newcomer@example.com', user.id, 3600_000));
      const accepted = await request(secureApp.app).post(`/api/invitations/${token}/accept`).send({ displayName: 'Newcomer', password: TEST_PASSWORD });
      expect(accepted.status).toBe(201);
      for (const response of [signedIn, accepted]) {
        const cookies = ([] as string[]).concat(response.headers['set-cookie']);
        const session = cookies.find((c) => c.startsWith('qb_session='))!;
        const csrf = cookies.find((c) => c.startsWith('qb_csrf='))!;
        expect(session).toMatch(/; HttpOnly/i);
        for (const cookie of [session, csrf]) {
          expect(cookie).toMatch(/; SameSite=Strict/i);
          expect(cookie).toMatch(/; Secure/i);
          expect(cookie).toMatch(/; Path=\//);
        }
        expect(csrf).not.toMatch(/HttpOnly/i);
      }
    } finally {
      await secureApp.db.destroy();
    }
  });
});

describe('CSRF', () => {
  it('refuses every state-changing route called with the session cookie but without its CSRF token', async () => {
    await resetTables(testApp);
    const user = await createAccount(testApp, 'admin');
    const session = await signIn(testApp, user.email);
    const other = await signIn(testApp, user.email);
    const changing = operations.filter((op) => op.method !== 'get' && op.access !== 'public');
    expect(changing.length).toBeGreaterThan(10);
    for (const op of changing) {
      const label = `${op.method} ${op.path}`;
      const without = await request(app)[op.method as Method](concretePath(op.path)).set('Cookie', session.cookieHeader).send({});
      expect(without.status, label).toBe(403);
      expect(without.body.title, label).toBe('CSRF check failed');
      const foreign = await request(app)[op.method as Method](concretePath(op.path)).set('Cookie', session.cookieHeader).set('X-CSRF-Token', other.csrf).send({});
      expect(foreign.status, label).toBe(403);
    }
    expect((await request(app).get('/api/auth/me').set('Cookie', session.cookieHeader)).status).toBe(200);
  });
});

describe('rate limits', () => {
  it('limits sign-in per address with the shipped defaults (30 per 15 minutes)', async () => {
    const defaults = loadConfig({ SESSION_SECRET: 'x'.repeat(40) }).signInLimit;
    expect(defaults).toEqual({ perAddress: 30, perAccount: 8, windowMs: 15 * 60_000 });
    const limited = createTestApp({ signInLimit: defaults });
    try {
      const statuses: number[] = [];
      for (let attempt = 0; attempt < 31; attempt += 1) {
        statuses.push((await request(limited.app).post('/api/auth/sign-in').send({ email: `nobody-${attempt}@example.com`, password: 'wrong-password' })).status);
      }
      expect(statuses.slice(0, 30)).toEqual(Array(30).fill(401));
      expect(statuses[30]).toBe(429);
    } finally {
      await limited.db.destroy();
    }
  }, 30_000);

  it('limits invitation look-ups and sign-ups per address, with a JSON problem and Retry-After', async () => {
    const limited = createTestApp();
    try {
      const statuses: number[] = [];
      for (let attempt = 0; attempt < 20; attempt += 1) {
        const call = attempt % 2 ? request(limited.app).get(`/api/invitations/${'x'.repeat(43)}`) : request(limited.app).post(`/api/invitations/${'x'.repeat(43)}/accept`).send({ displayName: 'Guess', password: TEST_PASSWORD });
        statuses.push((await call).status);
      }
      expect(statuses.every((s) => s === 404)).toBe(true);
      const blocked = await request(limited.app).get(`/api/invitations/${'y'.repeat(43)}`);
      expect(blocked.status).toBe(429);
      expect(blocked.headers['content-type']).toMatch(/^application\/problem\+json/);
      expect(Number(blocked.headers['retry-after'])).toBeGreaterThan(0);
      expect(blocked.body).toMatchObject({ status: 429, title: 'Too many attempts' });
    } finally {
      await limited.db.destroy();
    }
  });
});

describe('size limits', () => {
  it('answers 413 to a JSON body over the limit on every route that takes one, before anything else', async () => {
    const huge = JSON.stringify({ name: 'x'.repeat(3 * 1024 * 1024) });
    const withBody = operations.filter((op) => op.body);
    expect(withBody.length).toBeGreaterThan(10);
    for (const op of withBody) {
      const response = await request(app)[op.method as Method](concretePath(op.path)).set('Content-Type', 'application/json').send(huge);
      expect(response.status, `${op.method} ${op.path}`).toBe(413);
      expect(response.body).toMatchObject({ status: 413, title: 'Body too large' });
    }
  });

  it('follows the configured body limit', async () => {
    const small = createApp({ config: { ...testApp.config, bodyLimit: '16kb' }, db: testApp.db, logger: pino({ level: 'silent' }), version: 'test' });
    const over = await request(small).post('/api/auth/sign-in').send({ email: 'a@example.com', password: 'x'.repeat(20 * 1024) });
    expect(over.status).toBe(413);
    const under = await request(small).post('/api/auth/sign-in').send({ email: 'a@example.com', password: 'x'.repeat(1024) });
    expect(under.status).toBe(400);
  });

  it('answers 413 to an upload over the file limit, and 400 to a form with too many fields', async () => {
    await resetTables(testApp);
    const owner = await createAccount(testApp, 'designer');
    const auth = await sessionOf(testApp, owner);
    const designId = await storeDesign(testApp, owner, 'Line sensor');
    const big = await request(app).post(`/api/designs/${designId}/datasets/preview`).set(auth).attach('file', Buffer.alloc(MAX_DATASET_BYTES + 1, 'A,1,up,0,1.5\n'), 'bench.csv');
    expect(big.status).toBe(413);
    expect(big.body.errors).toEqual([{ path: 'file', message: expect.stringMatching(/Larger than/) }]);
    let crowded = request(app).post(`/api/designs/${designId}/datasets/preview`).set(auth);
    for (let i = 0; i < 30; i += 1) crowded = crowded.field(`field${i}`, 'x');
    const manyFields = await crowded.attach('file', Buffer.from('a,b\n1,2\n'), 'bench.csv');
    expect(manyFields.status).toBe(400);
    const twoFiles = await request(app).post(`/api/designs/${designId}/datasets/preview`).set(auth).attach('file', Buffer.from('a,b\n1,2\n'), 'a.csv').attach('file', Buffer.from('a,b\n1,2\n'), 'b.csv');
    expect(twoFiles.status).toBe(400);
  });
});

describe('what errors reveal', () => {
  const leaks = [
    { what: 'a stack trace', pattern: /\bat [\w.<>]+ \(|\.(ts|js|mjs):\d+:\d+/ },
    { what: 'a file path', pattern: /node_modules|\/api\/[\w-]+\/[\w.-]+\.ts|\/work\/|\/home\/|\/root\// },
    { what: 'SQL', pattern: /\b(select|insert into|update|delete from)\b[\s\S]*\b(from|set|values|where)\b|relation "|syntax error at|violates|duplicate key|column "/i },
    { what: 'a database error code or driver message', pattern: /\b(42P01|23505|57P01|ECONNREFUSED)\b|Connection terminated|pg-pool|kysely/i },
  ];

  function expectNothingRevealed(label: string, text: string) {
    for (const { what, pattern } of leaks) expect(pattern.test(text), `${label} reveals ${what}: ${text.slice(0, 300)}`).toBe(false);
  }

  let broken: ReturnType<typeof createApp>;
  let brokenDb: ReturnType<typeof createDatabase>;
  let down: ReturnType<typeof createApp>;
  let downDb: ReturnType<typeof createDatabase>;
  let token = '';

  beforeAll(async () => {
    await resetTables(testApp);
    const admin = await createAccount(testApp, 'admin');
    token = (await signIn(testApp, admin.email)).token;
    // The same server, a database without the schema: every query fails with an SQL error.
    const url = new URL(process.env.TEST_DATABASE_URL!);
    url.pathname = '/postgres';
    brokenDb = createDatabase(url.href, { max: 2 });
    broken = createApp({ config: testApp.config, db: brokenDb, logger: pino({ level: 'silent' }), version: 'test' });
    downDb = createDatabase('postgres://app@127.0.0.1:1/none', { max: 2 });
    down = createApp({ config: testApp.config, db: downDb, logger: pino({ level: 'silent' }), version: 'test' });
  });

  afterAll(async () => {
    await brokenDb.destroy();
    await downDb.destroy();
  });

  it('shows no stack trace, path or SQL when every query fails, on any route', async () => {
    for (const op of operations) {
      const label = `${op.method} ${op.path}`;
      const response = await request(broken)[op.method as Method](concretePath(op.path)).set('Authorization', `Bearer ${token}`).send({});
      if (op.path !== '/api/health') expect(response.status, label).toBeGreaterThanOrEqual(400);
      if (response.status >= 500 && op.path !== '/api/health') expect(response.body, label).toEqual({ status: 500, title: 'Internal error', detail: 'Something went wrong on the server; it has been logged.', errors: [] });
      expectNothingRevealed(label, response.text);
    }
  });

  it('shows no driver message when the database cannot be reached, on any route', async () => {
    for (const op of operations) {
      const label = `${op.method} ${op.path}`;
      const response = await request(down)[op.method as Method](concretePath(op.path)).set('Authorization', `Bearer ${token}`).send({});
      expectNothingRevealed(label, response.text);
    }
  });

  it('shows no internals for malformed requests on the working app', async () => {
    const auth = { Authorization: `Bearer ${token}` };
    const requests = {
      'a path parameter that is not a UUID': () => request(app).get('/api/designs/not-a-uuid').set(auth),
      'SQL in a sort key': () => request(app).get(`/api/designs?sort=${encodeURIComponent('name; drop table designs')}`).set(auth),
      'truncated JSON': () => request(app).post('/api/designs').set(auth).set('Content-Type', 'application/json').send('{"name": '),
      'SQL in an e-mail': () => request(app).post('/api/users').set(auth).send({ email: "' or 1=1 --", displayName: 'x', role: 'root', password: 'short' }),
      'a broken percent-encoding': () => request(app).get('/api/%E0%A4%A').set(auth),
      'LIKE wildcards in a search': () => request(app).get(`/api/users?q=${encodeURIComponent('%\\_')}&sort=email`).set(auth),
    };
    for (const [label, send] of Object.entries(requests)) {
      const response = await send();
      expect(response.status, label).toBeLessThan(500);
      expectNothingRevealed(label, response.text);
    }
  });
});
