import request from 'supertest';
import { afterAll, beforeEach, describe, expect, it } from 'vitest';
import { createAccount, createTestApp, resetTables, signIn } from '../support/test-app';

const testApp = createTestApp();
const { app } = testApp;

afterAll(async () => {
  await testApp.db.destroy();
});

let adminAuth: Record<string, string>;
let designerAuth: Record<string, string>;
let adminId: string;

beforeEach(async () => {
  await resetTables(testApp);
  const admin = await createAccount(testApp, 'admin', 'root@example.com');
  adminId = admin.id;
  const designer = await createAccount(testApp, 'designer', 'dora@example.com');
  adminAuth = { Authorization: `Bearer ${(await signIn(testApp, admin.email)).token}` };
  designerAuth = { Authorization: `Bearer ${(await signIn(testApp, designer.email)).token}` };
});

describe('accounts (admin routes)', () => {
  it('answers 401 signed out and 403 for a designer or reviewer on every admin route', async () => {
    const reviewer = await createAccount(testApp, 'reviewer');
    const reviewerAuth = { Authorization: `Bearer ${(await signIn(testApp, reviewer.email)).token}` };
    const routes = [
      () => request(app).get('/api/users'),
      () => request(app).post('/api/users').send({}),
      () => request(app).patch(`/api/users/${adminId}`).send({ role: 'designer' }),
    ];
    for (const route of routes) {
      expect((await route()).status).toBe(401);
      const designer = await route().set(designerAuth);
      expect(designer.status).toBe(403);
      expect(designer.body).toMatchObject({ status: 403, title: 'Forbidden' });
      expect((await route().set(reviewerAuth)).status).toBe(403);
    }
  });

  it('lists accounts sorted and paged, with a search', async () => {
    for (const name of ['carla', 'bruno', 'emil']) await createAccount(testApp, 'reviewer', `${name}@example.com`);
    const page0 = await request(app).get('/api/users?sort=email&order=asc&page=0&pageSize=2').set(adminAuth);
    expect(page0.status).toBe(200);
    expect(page0.body.total).toBe(5);
    expect(page0.body.items.map((u: { email: string }) => u.email)).toEqual(['bruno@example.com', 'carla@example.com']);
    const page2 = await request(app).get('/api/users?sort=email&order=asc&page=2&pageSize=2').set(adminAuth);
    expect(page2.body.items.map((u: { email: string }) => u.email)).toEqual(['root@example.com']);
    const desc = await request(app).get('/api/users?sort=email&order=desc&pageSize=1').set(adminAuth);
    expect(desc.body.items[0].email).toBe('root@example.com');
    const search = await request(app).get('/api/users?q=RUN').set(adminAuth);
    expect(search.body.items.map((u: { email: string }) => u.email)).toEqual(['bruno@example.com']);
  });

  it('answers 400 naming the query parameter for bad paging', async () => {
    const response = await request(app).get('/api/users?page=-1&pageSize=abc&sort=password').set(adminAuth);
    expect(response.status).toBe(400);
    expect(response.body.errors.map((e: { path: string }) => e.path).sort()).toEqual(['page', 'pageSize', 'sort']);
  });

  it('creates an account, keeps e-mails unique whatever their case, and checks the password', async () => {
    const created = await request(app)
      .post('/api/users')
      .set(adminAuth)
      .send({ email: 'New.Person@Example.com', displayName: 'New Person', role: 'reviewer', password: 'long-enough-secret' });
    expect(created.status).toBe(201);
    expect(created.body.user).toMatchObject({ email: 'new.person@example.com', role: 'reviewer', disabled: false });
    const duplicate = await request(app)
      .post('/api/users')
      .set(adminAuth)
      .send({ email: 'NEW.PERSON@example.com', displayName: 'Again', role: 'designer', password: 'long-enough-secret' });
    expect(duplicate.status).toBe(409);
    expect(duplicate.body.errors).toEqual([{ path: 'email', message: 'This e-mail already has an account' }]);
    const common = await request(app)
      .post('/api/users')
      .set(adminAuth)
      .send({ email: 'x@example.com', displayName: 'X', role: 'designer', password: 'qwertyuiop' });
    expect(common.status).toBe(400);
    expect(common.body.errors[0].path).toBe('password');
    const bad = await request(app).post('/api/users').set(adminAuth).send({ email: 'not-an-address', displayName: '', role: 'boss', password: 1 });
    expect(bad.status).toBe(400);
    expect(bad.body.errors.map((e: { path: string }) => e.path).sort()).toEqual(['displayName', 'email', 'password', 'role']);
  });

  it('changes a role and disables an account, ending its sessions at once', async () => {
    const target = await createAccount(testApp, 'designer');
    const { token } = await signIn(testApp, target.email);
    const promoted = await request(app).patch(`/api/users/${target.id}`).set(adminAuth).send({ role: 'reviewer' });
    expect(promoted.status).toBe(200);
    expect(promoted.body.user.role).toBe('reviewer');
    expect((await request(app).get('/api/auth/me').set('Authorization', `Bearer ${token}`)).status).toBe(401);
    const second = await signIn(testApp, target.email);
    const disabled = await request(app).patch(`/api/users/${target.id}`).set(adminAuth).send({ disabled: true });
    expect(disabled.body.user.disabled).toBe(true);
    expect((await request(app).get('/api/auth/me').set('Authorization', `Bearer ${second.token}`)).status).toBe(401);
    const enabled = await request(app).patch(`/api/users/${target.id}`).set(adminAuth).send({ disabled: false });
    expect(enabled.body.user.disabled).toBe(false);
  });

  it('keeps the last enabled administrator, and answers 404 or 400 for unknown or malformed ids', async () => {
    const second = await createAccount(testApp, 'admin');
    const secondAuth = { Authorization: `Bearer ${(await signIn(testApp, second.email)).token}` };
    const self = await request(app).patch(`/api/users/${second.id}`).set(secondAuth).send({ disabled: true });
    expect(self.status).toBe(409);
    expect(self.body.errors[0]).toEqual({ path: 'disabled', message: 'Not on your own account' });
    await request(app).patch(`/api/users/${second.id}`).set(adminAuth).send({ role: 'designer' });
    const demote = await request(app).patch(`/api/users/${adminId}`).set(adminAuth).send({ role: 'designer' });
    expect(demote.status).toBe(409);
    expect(demote.body.errors[0].path).toBe('role');
    const disable = await request(app).patch(`/api/users/${adminId}`).set(adminAuth).send({ disabled: true });
    expect(disable.status).toBe(409);
    const unknown = await request(app).patch('/api/users/00000000-0000-4000-8000-000000000000').set(adminAuth).send({ role: 'designer' });
    expect(unknown.status).toBe(404);
    const malformed = await request(app).patch('/api/users/42').set(adminAuth).send({ role: 'designer' });
    expect(malformed.status).toBe(400);
    expect(malformed.body.errors[0].path).toBe('id');
    const empty = await request(app).patch(`/api/users/${adminId}`).set(adminAuth).send({});
    expect(empty.status).toBe(400);
  });
});
