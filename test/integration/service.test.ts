import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { pino } from 'pino';
import request from 'supertest';
import { columnMappingSchema } from '@shared/contracts/calibration';
import { afterAll, describe, expect, it } from 'vitest';
import { createApp, operations } from '../../api/app';
import { ConfigError, loadConfig } from '../../api/config';
import { createDatabase } from '../../api/db/database';
import { createAccount, createTestApp, signIn } from '../support/test-app';

const testApp = createTestApp();
const { app } = testApp;

afterAll(async () => {
  await testApp.db.destroy();
});

describe('health', () => {
  it('reports the database up', async () => {
    const response = await request(app).get('/api/health');
    expect(response.status).toBe(200);
    expect(response.body).toMatchObject({ status: 'ok', database: { up: true } });
    expect(response.body.database.latencyMs).toBeGreaterThanOrEqual(0);
  });

  it('reports the database down with 503 when it cannot be reached', async () => {
    const unreachable = createDatabase('postgres://app@127.0.0.1:1/none');
    const down = createApp({ config: testApp.config, db: unreachable, logger: pino({ level: 'silent' }), version: 'test' });
    const response = await request(down).get('/api/health');
    expect(response.status).toBe(503);
    expect(response.body).toMatchObject({ status: 'degraded', database: { up: false, latencyMs: null } });
    const signIn = await request(down).post('/api/auth/sign-in').send({ email: 'a@example.com', password: 'whatever-it-is' });
    expect(signIn.status).toBe(503);
    expect(signIn.body.title).toBe('Database unavailable');
    await unreachable.destroy();
  });
});

describe('API documentation', () => {
  it('serves an OpenAPI 3.1 document generated from the zod schemas, covering every route', async () => {
    const response = await request(app).get('/api/openapi.json');
    expect(response.status).toBe(200);
    expect(response.body.openapi).toBe('3.1.0');
    const documented = operations.map((op) => `${op.method} ${op.path}`).sort();
    const inDocument = Object.entries(response.body.paths as Record<string, Record<string, unknown>>)
      .flatMap(([path, methods]) => Object.keys(methods).map((method) => `${method} ${path}`))
      .sort();
    expect(inDocument).toEqual(documented);
    expect(inDocument.length).toBeGreaterThan(20);
    expect(response.body.components.schemas.Design).toBeDefined();
    const createUser = response.body.components.schemas.CreateUser;
    expect(createUser.properties.password.minLength).toBe(10);
    expect(createUser.required).toEqual(expect.arrayContaining(['email', 'displayName', 'role', 'password']));
    const listParameters = response.body.paths['/api/users'].get.parameters.map((p: { name: string }) => p.name);
    expect(listParameters).toEqual(expect.arrayContaining(['page', 'pageSize', 'sort', 'order', 'q']));
  });

  it('documents the bench-file uploads as multipart forms: the file and every mapping field the route reads', async () => {
    const response = await request(app).get('/api/openapi.json');
    const mappingFields = Object.keys(columnMappingSchema.shape).sort();
    for (const [path, required] of [
      ['/api/designs/{id}/datasets', ['file', 'referenceColumn', 'referenceUnit', 'readoutColumn', 'readoutUnit', 'cellColumn', 'runColumn', 'directionColumn']],
      ['/api/designs/{id}/datasets/preview', ['file']],
    ] as const) {
      const form = response.body.paths[path].post.requestBody.content['multipart/form-data'].schema;
      expect(form.properties.file).toMatchObject({ type: 'string', format: 'binary' });
      expect(Object.keys(form.properties).filter((name) => name !== 'file').sort(), path).toEqual(mappingFields);
      expect([...form.required].sort(), path).toEqual([...required].sort());
      expect(form.properties.referenceUnit.enum).toEqual(expect.arrayContaining(['Pa', 'kPa', 'mL/min']));
    }
  });

  it('documents only routes that exist: each answers something other than the JSON 404 for unknown routes', async () => {
    const id = '00000000-0000-4000-8000-000000000000';
    // Signed in as an admin, so that role checks mounted on a prefix cannot hide a missing route.
    const admin = await createAccount(testApp, 'admin');
    const { token } = await signIn(testApp, admin.email);
    for (const op of operations.filter((o) => o.path !== '/api/auth/sign-out')) {
      const path = op.path.replace(/\{(\w+)\}/g, (_m, name: string) => (name === 'number' ? '1' : name === 'token' ? 'x'.repeat(43) : id));
      const response = await request(app)[op.method](path).set('Authorization', `Bearer ${token}`).send({});
      expect(response.body.detail ?? '', `${op.method} ${op.path}`).not.toMatch(/^No route/);
    }
  });

  it('serves the docs page with its bundled assets', async () => {
    const page = await request(app).get('/api/docs');
    expect(page.status).toBe(200);
    expect(page.text).toContain('/api/docs/assets/swagger-ui-bundle.js');
    const bundle = await request(app).get('/api/docs/assets/swagger-ui-bundle.js');
    expect(bundle.status).toBe(200);
  });
});

describe('errors and headers', () => {
  it('answers a JSON 404 problem for an unknown API route', async () => {
    const response = await request(app).get('/api/nothing-here');
    expect(response.status).toBe(404);
    expect(response.body).toEqual({ status: 404, title: 'Not found', detail: 'No route GET /api/nothing-here.', errors: [] });
  });

  it('sends security headers with a Content-Security-Policy that allows no inline script', async () => {
    const response = await request(app).get('/api/health');
    const csp = response.headers['content-security-policy'];
    expect(csp).toContain("script-src 'self'");
    expect(csp).not.toMatch(/script-src[^;]*unsafe-inline/);
    expect(response.headers['x-content-type-options']).toBe('nosniff');
    expect(response.headers['x-powered-by']).toBeUndefined();
  });
});

describe('single-page app', () => {
  it('serves the built app with a history fallback, but not for API paths', async () => {
    const dir = mkdtempSync(path.join(tmpdir(), 'qb-static-'));
    try {
      writeFileSync(path.join(dir, 'index.html'), '<!doctype html><title>Quietbridge</title>');
      writeFileSync(path.join(dir, 'main.js'), 'console.log(1)');
      const spa = createApp({ config: { ...testApp.config, staticDir: dir }, db: testApp.db, logger: pino({ level: 'silent' }), version: 'test' });
      expect((await request(spa).get('/main.js')).text).toBe('console.log(1)');
      const deep = await request(spa).get('/designs/42/chain');
      expect(deep.status).toBe(200);
      expect(deep.text).toContain('<title>Quietbridge</title>');
      expect((await request(spa).get('/api/unknown')).status).toBe(404);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});

describe('configuration', () => {
  it('stops start-up in production without a session secret, with a message naming it', () => {
    expect(() => loadConfig({ NODE_ENV: 'production' })).toThrow(ConfigError);
    expect(() => loadConfig({ NODE_ENV: 'production' })).toThrow(/SESSION_SECRET is required/);
  });

  it('names each invalid variable', () => {
    expect(() => loadConfig({ PORT: 'eighty', BCRYPT_COST: '4', SESSION_SECRET: 'x'.repeat(40) })).toThrow(/PORT[\s\S]*BCRYPT_COST/);
  });

  it('has defaults for local use', () => {
    const config = loadConfig({ SESSION_SECRET: 'x'.repeat(40) });
    expect(config).toMatchObject({ host: '127.0.0.1', port: 4200, databaseUrl: 'postgres://app@127.0.0.1:54329/quietbridge', cookieSecure: false });
    expect(config.bcryptCost).toBeGreaterThanOrEqual(10);
  });
});
