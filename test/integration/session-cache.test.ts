import { sql } from 'kysely';
import request from 'supertest';
import { afterAll, beforeEach, describe, expect, it } from 'vitest';
import { SessionCache } from '../../api/auth/session-cache';
import { createAccount, createTestApp, resetTables, signIn, TEST_PASSWORD } from '../support/test-app';

// The session cache (api/auth/session-cache.ts) against the real database: what it remembers, and
// that every way a session or an account can change makes it forget, at once for changes made
// through the API and within the NOTIFY delivery time for changes made anywhere else.
const testApp = createTestApp();
const { app } = testApp;
const bearer = (token: string) => ({ Authorization: `Bearer ${token}` });
const sid = (token: string) => (JSON.parse(Buffer.from(token.split('.')[1]!, 'base64url').toString('utf8')) as { sid: string }).sid;
const me = (token: string) => request(app).get('/api/auth/me').set(bearer(token));

async function within(ms: number, done: () => Promise<boolean> | boolean): Promise<boolean> {
  const deadline = Date.now() + ms;
  while (!(await done())) {
    if (Date.now() > deadline) return false;
    await new Promise((resolve) => setTimeout(resolve, 20));
  }
  return true;
}

afterAll(async () => {
  await testApp.db.destroy();
});

beforeEach(async () => {
  await resetTables(testApp);
  expect(testApp.sessions.active).toBe(true);
});

describe('session cache', () => {
  it('remembers a session after its first request and answers from memory', async () => {
    const user = await createAccount(testApp, 'designer');
    const { token } = await signIn(testApp, user.email);
    expect(testApp.sessions.get(sid(token))).toBeUndefined();
    expect((await me(token)).status).toBe(200);
    expect(testApp.sessions.get(sid(token))?.id).toBe(user.id);
    expect((await me(token)).body.user.id).toBe(user.id);
  });

  it('forgets at once what the API changes: sign-out, disabling, a role change, a new name, a password change', async () => {
    const [admin, dana, otto] = await Promise.all([createAccount(testApp, 'admin'), createAccount(testApp, 'designer'), createAccount(testApp, 'designer')]);
    const adminToken = (await signIn(testApp, admin.email)).token;

    const signedOut = (await signIn(testApp, dana.email)).token;
    expect((await me(signedOut)).status).toBe(200);
    expect((await request(app).post('/api/auth/sign-out').set(bearer(signedOut))).status).toBe(204);
    expect((await me(signedOut)).status).toBe(401);

    const renamed = (await signIn(testApp, dana.email)).token;
    expect((await me(renamed)).status).toBe(200);
    expect((await request(app).patch(`/api/users/${dana.id}`).set(bearer(adminToken)).send({ displayName: 'Dana Renamed' })).status).toBe(200);
    expect((await me(renamed)).body.user.displayName).toBe('Dana Renamed');

    expect((await request(app).patch(`/api/users/${dana.id}`).set(bearer(adminToken)).send({ role: 'reviewer' })).status).toBe(200);
    expect((await me(renamed)).status).toBe(401);

    const keeper = (await signIn(testApp, otto.email)).token;
    const other = (await signIn(testApp, otto.email)).token;
    expect((await me(keeper)).status).toBe(200);
    expect((await me(other)).status).toBe(200);
    const changed = await request(app).post('/api/auth/password').set(bearer(keeper)).send({ currentPassword: TEST_PASSWORD, newPassword: 'a-new-passphrase-2026' });
    expect(changed.status).toBe(204);
    expect((await me(other)).status).toBe(401);
    expect((await me(keeper)).status).toBe(200);

    expect((await request(app).patch(`/api/users/${otto.id}`).set(bearer(adminToken)).send({ disabled: true })).status).toBe(200);
    expect((await me(keeper)).status).toBe(401);
  });

  it('forgets, within a second, a change made straight in the database by another process', async () => {
    const user = await createAccount(testApp, 'designer');
    const { token } = await signIn(testApp, user.email);
    expect((await me(token)).status).toBe(200);
    expect(testApp.sessions.get(sid(token))).toBeDefined();
    await testApp.db.updateTable('sessions').set({ revoked_at: sql<Date>`now()` }).where('id', '=', sid(token)).execute();
    expect(await within(1000, () => testApp.sessions.get(sid(token)) === undefined)).toBe(true);
    expect((await me(token)).status).toBe(401);

    const second = (await signIn(testApp, user.email)).token;
    expect((await me(second)).status).toBe(200);
    await testApp.db.updateTable('users').set({ disabled: true }).where('id', '=', user.id).execute();
    expect(await within(1000, async () => (await me(second)).status === 401)).toBe(true);
  });

  it('forgets everything after a TRUNCATE of the accounts', async () => {
    const user = await createAccount(testApp, 'designer');
    const { token } = await signIn(testApp, user.email);
    expect((await me(token)).status).toBe(200);
    await sql`truncate table sessions`.execute(testApp.db);
    expect(await within(1000, () => testApp.sessions.get(sid(token)) === undefined)).toBe(true);
    expect((await me(token)).status).toBe(401);
  });

  it('stops serving from memory while its LISTEN connection is away, and starts again when it is back', async () => {
    const user = await createAccount(testApp, 'designer');
    const { token } = await signIn(testApp, user.email);
    expect((await me(token)).status).toBe(200);
    await sql`select pg_terminate_backend(pid) from pg_stat_activity where query like 'listen qb_auth_changes%' and pid <> pg_backend_pid()`.execute(testApp.db);
    expect(await within(2000, () => !testApp.sessions.active)).toBe(true);
    expect(testApp.sessions.get(sid(token))).toBeUndefined();
    // Still correct without it: every request asks the database.
    expect((await me(token)).status).toBe(200);
    expect(await within(5000, () => testApp.sessions.active)).toBe(true);
    expect((await me(token)).status).toBe(200);
    expect(testApp.sessions.get(sid(token))).toBeDefined();
  });

  it('never stores a lookup that started before a change', async () => {
    const cache = new SessionCache(process.env.TEST_DATABASE_URL!);
    cache.start();
    try {
      expect(await cache.ready()).toBe(true);
      const row = { id: 'u1' } as never;
      const ticket = cache.ticket();
      cache.forgetUser('someone else');
      cache.store(ticket, 's1', row, new Date(Date.now() + 60_000));
      expect(cache.get('s1')).toBeUndefined();
      cache.store(cache.ticket(), 's1', row, new Date(Date.now() + 60_000));
      expect(cache.get('s1')).toBe(row);
      // Nor keeps a session past its own expiry.
      cache.store(cache.ticket(), 's2', row, new Date(Date.now() - 1));
      expect(cache.get('s2')).toBeUndefined();
    } finally {
      await cache.stop();
    }
    expect(cache.active).toBe(false);
  });
});
