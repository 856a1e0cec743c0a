import request from 'supertest';
import { afterAll, beforeEach, describe, expect, it } from 'vitest';
import { createAccount, createTestApp, resetTables, signIn, TEST_PASSWORD } from '../support/test-app';

const testApp = createTestApp();
const { app } = testApp;

afterAll(async () => {
  await testApp.db.destroy();
});

beforeEach(async () => {
  await resetTables(testApp);
});

describe('sign-in', () => {
  it('returns the user and a token and sets an httpOnly SameSite=Strict session cookie', async () => {
    await createAccount(testApp, 'designer', 'ada@example.com');
    const response = await request(app).post('/api/auth/sign-in').send({ email: 'ADA@example.com', password: TEST_PASSWORD });
    expect(response.status).toBe(200);
    expect(response.body.user).toMatchObject({ email: 'ada@example.com', role: 'designer', disabled: false });
    expect(response.body.user.passwordHash).toBeUndefined();
    expect(response.body.token).toMatch(/^[\w-]+\.[\w-]+\.[\w-]+$/);
    expect(Date.parse(response.body.expiresAt)).toBeGreaterThan(Date.now());
    const cookies = ([] as string[]).concat(response.headers['set-cookie']);
    const session = cookies.find((cookie) => cookie.startsWith('qb_session='));
    expect(session).toMatch(/HttpOnly/i);
    expect(session).toMatch(/SameSite=Strict/i);
    const csrf = cookies.find((cookie) => cookie.startsWith('qb_csrf='));
    expect(csrf).toMatch(/SameSite=Strict/i);
    expect(csrf).not.toMatch(/HttpOnly/i);
  });

  it('answers 401 with the same message for a wrong password and an unknown e-mail', async () => {
    await createAccount(testApp, 'designer', 'ada@example.com');
    const wrongPassword = await request(app).post('/api/auth/sign-in').send({ email: 'ada@example.com', password: 'not-the-password' });
    const unknown = await request(app).post('/api/auth/sign-in').send({ email: 'nobody@example.com', password: TEST_PASSWORD });
    expect(wrongPassword.status).toBe(401);
    expect(unknown.status).toBe(401);
    expect(wrongPassword.body.detail).toBe(unknown.body.detail);
    expect(wrongPassword.body).toMatchObject({ status: 401, title: 'Sign-in failed', errors: [] });
    expect(wrongPassword.headers['set-cookie']).toBeUndefined();
  });

  it('refuses a disabled account', async () => {
    const user = await createAccount(testApp, 'designer');
    await testApp.db.updateTable('users').set({ disabled: true }).where('id', '=', user.id).execute();
    const response = await request(app).post('/api/auth/sign-in').send({ email: user.email, password: TEST_PASSWORD });
    expect(response.status).toBe(401);
    expect(response.body.detail).toMatch(/disabled/);
  });

  it('answers 400 with field paths for a bad body, never 500', async () => {
    const bodies: unknown[] = [{}, { email: 5, password: [] }, { email: 'a@example.com' }, { email: 'a@example.com', password: 'x', extra: true }];
    for (const body of bodies) {
      const response = await request(app).post('/api/auth/sign-in').send(body as object);
      expect(response.status).toBe(400);
      expect(response.body.errors.length).toBeGreaterThan(0);
      for (const error of response.body.errors) expect(typeof error.path).toBe('string');
    }
    const missing = await request(app).post('/api/auth/sign-in').send({});
    expect(missing.body.errors.map((e: { path: string }) => e.path)).toEqual(['email', 'password']);
    const wrongType = await request(app).post('/api/auth/sign-in').send({ email: 5, password: 'x' });
    expect(wrongType.body.errors[0]).toEqual({ path: 'email', message: 'E-mail must be text' });
  });

  it('answers 400 for malformed JSON and a missing body, and 413 for an oversized one', async () => {
    const malformed = await request(app).post('/api/auth/sign-in').set('Content-Type', 'application/json').send('{"email":');
    expect(malformed.status).toBe(400);
    expect(malformed.body.title).toBe('Bad request');
    const noBody = await request(app).post('/api/auth/sign-in').set('Content-Type', 'text/plain').send('email=a');
    expect(noBody.status).toBe(400);
    expect(noBody.body.detail).toMatch(/JSON body/);
    const huge = await request(app)
      .post('/api/auth/sign-in')
      .set('Content-Type', 'application/json')
      .send(JSON.stringify({ email: 'a@example.com', password: 'x'.repeat(3 * 1024 * 1024) }));
    expect(huge.status).toBe(413);
  });
});

describe('sessions', () => {
  it('answers 401 without a session and with a tampered or foreign token', async () => {
    expect((await request(app).get('/api/auth/me')).status).toBe(401);
    const user = await createAccount(testApp, 'designer');
    const { token } = await signIn(testApp, user.email);
    const [header, payload, signature] = token.split('.');
    const tampered = `${header}.${payload}.${signature!.slice(0, -2)}xx`;
    expect((await request(app).get('/api/auth/me').set('Authorization', `Bearer ${tampered}`)).status).toBe(401);
    expect((await request(app).get('/api/auth/me').set('Authorization', 'Bearer not-a-token')).status).toBe(401);
    const me = await request(app).get('/api/auth/me').set('Authorization', `Bearer ${token}`);
    expect(me.status).toBe(200);
    expect(me.body.user.email).toBe(user.email);
  });

  it('rejects an expired token', async () => {
    const shortLived = createTestApp({ sessionTtlSeconds: 1 });
    try {
      const user = await createAccount(shortLived, 'designer');
      const { token } = await signIn(shortLived, user.email);
      await new Promise((resolve) => setTimeout(resolve, 1100));
      expect((await request(shortLived.app).get('/api/auth/me').set('Authorization', `Bearer ${token}`)).status).toBe(401);
    } finally {
      await shortLived.db.destroy();
    }
  });

  it('ends the session at sign-out, and a disabled account at once', async () => {
    const user = await createAccount(testApp, 'designer');
    const first = await signIn(testApp, user.email);
    const signOut = await request(app).post('/api/auth/sign-out').set('Authorization', `Bearer ${first.token}`);
    expect(signOut.status).toBe(204);
    expect((await request(app).get('/api/auth/me').set('Authorization', `Bearer ${first.token}`)).status).toBe(401);

    const second = await signIn(testApp, user.email);
    await testApp.db.updateTable('users').set({ disabled: true }).where('id', '=', user.id).execute();
    expect((await request(app).get('/api/auth/me').set('Authorization', `Bearer ${second.token}`)).status).toBe(401);
  });

  it('accepts the cookie for reads but needs the CSRF header for state-changing requests', async () => {
    const user = await createAccount(testApp, 'designer');
    const session = await signIn(testApp, user.email);
    const me = await request(app).get('/api/auth/me').set('Cookie', session.cookieHeader);
    expect(me.status).toBe(200);

    const noHeader = await request(app).post('/api/auth/sign-out').set('Cookie', session.cookieHeader);
    expect(noHeader.status).toBe(403);
    expect(noHeader.body.title).toBe('CSRF check failed');
    const wrongHeader = await request(app).post('/api/auth/sign-out').set('Cookie', session.cookieHeader).set('X-CSRF-Token', 'forged');
    expect(wrongHeader.status).toBe(403);

    const other = await signIn(testApp, user.email);
    const otherSessionsToken = await request(app).post('/api/auth/sign-out').set('Cookie', session.cookieHeader).set('X-CSRF-Token', other.csrf);
    expect(otherSessionsToken.status).toBe(403);

    const withHeader = await request(app).post('/api/auth/sign-out').set('Cookie', session.cookieHeader).set('X-CSRF-Token', session.csrf);
    expect(withHeader.status).toBe(204);
    expect(([] as string[]).concat(withHeader.headers['set-cookie']).some((c) => /qb_session=;/.test(c))).toBe(true);
  });
});

describe('sign-in rate limit', () => {
  it('limits failed attempts per account with 429 and Retry-After, whatever the address', async () => {
    const limited = createTestApp({ signInLimit: { perAddress: 100, perAccount: 3, windowMs: 60_000 } });
    try {
      const user = await createAccount(limited, 'designer');
      for (let attempt = 0; attempt < 3; attempt += 1) {
        const response = await request(limited.app).post('/api/auth/sign-in').send({ email: user.email, password: 'wrong-password' });
        expect(response.status).toBe(401);
      }
      const blocked = await request(limited.app).post('/api/auth/sign-in').send({ email: user.email, password: TEST_PASSWORD });
      expect(blocked.status).toBe(429);
      expect(Number(blocked.headers['retry-after'])).toBeGreaterThan(0);
      expect(blocked.body).toMatchObject({ status: 429, title: 'Too many sign-in attempts' });
      const otherAccount = await createAccount(limited, 'designer');
      expect((await request(limited.app).post('/api/auth/sign-in').send({ email: otherAccount.email, password: TEST_PASSWORD })).status).toBe(200);
    } finally {
      await limited.db.destroy();
    }
  });

  it('limits every attempt from one address', async () => {
    const limited = createTestApp({ signInLimit: { perAddress: 4, perAccount: 100, windowMs: 60_000 } });
    try {
      const user = await createAccount(limited, 'designer');
      for (let attempt = 0; attempt < 4; attempt += 1) {
        expect((await request(limited.app).post('/api/auth/sign-in').send({ email: user.email, password: TEST_PASSWORD })).status).toBe(200);
      }
      const blocked = await request(limited.app).post('/api/auth/sign-in').send({ email: user.email, password: TEST_PASSWORD });
      expect(blocked.status).toBe(429);
      expect(blocked.body.detail).toMatch(/from this address/);
    } finally {
      await limited.db.destroy();
    }
  });
});

describe('password change', () => {
  it('checks the current password, rejects short and common passwords with field paths, and ends other sessions', async () => {
    const user = await createAccount(testApp, 'reviewer');
    const current = await signIn(testApp, user.email);
    const other = await signIn(testApp, user.email);
    const auth = { Authorization: `Bearer ${current.token}` };

    const wrong = await request(app).post('/api/auth/password').set(auth).send({ currentPassword: 'nope', newPassword: 'a-much-better-secret' });
    expect(wrong.status).toBe(400);
    expect(wrong.body.errors).toEqual([{ path: 'currentPassword', message: 'Current password is wrong' }]);

    const short = await request(app).post('/api/auth/password').set(auth).send({ currentPassword: TEST_PASSWORD, newPassword: 'short' });
    expect(short.status).toBe(400);
    expect(short.body.errors[0].path).toBe('newPassword');

    const common = await request(app).post('/api/auth/password').set(auth).send({ currentPassword: TEST_PASSWORD, newPassword: 'password123' });
    expect(common.status).toBe(400);
    expect(common.body.errors[0]).toMatchObject({ path: 'newPassword', message: expect.stringMatching(/too common/) });

    const changed = await request(app).post('/api/auth/password').set(auth).send({ currentPassword: TEST_PASSWORD, newPassword: 'a-much-better-secret' });
    expect(changed.status).toBe(204);
    expect((await request(app).get('/api/auth/me').set(auth)).status).toBe(200);
    expect((await request(app).get('/api/auth/me').set('Authorization', `Bearer ${other.token}`)).status).toBe(401);
    expect((await request(app).post('/api/auth/sign-in').send({ email: user.email, password: 'a-much-better-secret' })).status).toBe(200);
  });
});
