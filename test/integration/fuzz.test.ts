import { appendFileSync } from 'node:fs';
import fc from 'fast-check';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { operations } from '../../api/app';
import { createAccount, createTestApp, resetTables, signIn } from '../support/test-app';

// Property: whatever arrives at any route — wrong types, missing and extra fields, huge numbers,
// NaN-like strings, deep nesting, long strings, invalid UTF-8, wrong content types — the API answers
// below 500, and every rejection is a JSON problem whose field errors name a path.

const testApp = createTestApp();
const { app } = testApp;
const TOTAL_REQUESTS = Number(process.env.FUZZ_REQUESTS ?? 10_000);
const fuzzed = operations.filter((op) => op.path !== '/api/auth/sign-out');
const runsPerRoute = Math.ceil(TOTAL_REQUESTS / fuzzed.length);

let token = '';

beforeAll(async () => {
  await resetTables(testApp);
  const admin = await createAccount(testApp, 'admin');
  token = (await signIn(testApp, admin.email)).token;
});

afterAll(async () => {
  await testApp.db.destroy();
});

const nastyString = fc.oneof(
  fc.string({ maxLength: 40 }),
  fc.constantFrom('NaN', 'Infinity', '-Infinity', '1e999', '-0', 'null', 'undefined', 'true', '__proto__', 'constructor', '../../etc/passwd', '%00', "' or 1=1 --", '=cmd|/c calc!A1', '<script>alert(1)</script>'),
  fc.string({ minLength: 5000, maxLength: 20000 }),
  fc.string({ unit: 'binary', maxLength: 30 }),
);
const nastyNumber = fc.oneof(fc.double(), fc.integer(), fc.constantFrom(Number.MAX_SAFE_INTEGER, 1e308, -1e308, 2 ** 53 + 1, 0, -1));
const leaf = fc.oneof(nastyString, nastyNumber, fc.boolean(), fc.constant(null));
const value = fc.letrec((tie) => ({
  node: fc.oneof({ depthSize: 'small' }, leaf, fc.array(tie('node'), { maxLength: 4 }), fc.dictionary(fc.string({ maxLength: 12 }), tie('node'), { maxKeys: 5 })),
})).node;

class RawJson {
  constructor(readonly text: string) {}
  toString() {
    return `<${this.text.length} characters of nested JSON>`;
  }
}

/** Bodies shaped like the route's own fields but with wrong or hostile values, or not shaped at all. */
function bodyFor(keys: string[]) {
  const shaped = keys.length ? fc.record(Object.fromEntries(keys.map((k) => [k, value])), { requiredKeys: [] }) : fc.constant({});
  // Deep nesting travels as raw JSON text, so that only the server has to parse it.
  const deep = fc.integer({ min: 500, max: 20000 }).map((depth) => new RawJson('['.repeat(depth) + ']'.repeat(depth)));
  return fc.oneof(shaped, value, deep);
}

function pathValue() {
  return fc.oneof(fc.uuid(), nastyString.filter((s) => s.length > 0 && s.length < 300), nastyNumber.map(String));
}

type Encoding = 'json' | 'text' | 'form' | 'invalidUtf8' | 'brokenJson';

function bodyKeys(schema: unknown): string[] {
  const shape = (schema as { shape?: Record<string, unknown>; _zod?: { def?: { shape?: Record<string, unknown> } } } | undefined);
  const fields = shape?.shape ?? shape?._zod?.def?.shape;
  return fields ? Object.keys(fields) : [];
}

describe('fuzzed requests on every route', () => {
  it(`answers ${TOTAL_REQUESTS} generated requests below 500 with JSON problems naming fields`, async () => {
    for (const op of fuzzed) {
      const started = performance.now();
      const keys = bodyKeys(op.body);
      const queryKeys = bodyKeys(op.query);
      await fc.assert(
        fc.asyncProperty(
          fc.array(pathValue(), { minLength: 3, maxLength: 3 }),
          fc.dictionary(fc.constantFrom(...queryKeys, 'x', 'page'), nastyString, { maxKeys: 4 }),
          bodyFor(keys),
          fc.constantFrom<Encoding>('json', 'json', 'json', 'text', 'form', 'invalidUtf8', 'brokenJson'),
          async (params, query, body, encoding) => {
            let index = 0;
            const path = op.path.replace(/\{\w+\}/g, () => encodeURIComponent(params[index++]!));
            let call = request(app)[op.method](path).query(query).set('Authorization', `Bearer ${token}`);
            if (op.method !== 'get') {
              const text = body instanceof RawJson ? body.text : (JSON.stringify(body) ?? 'null');
              if (encoding === 'json') call = call.set('Content-Type', 'application/json').send(text);
              else if (encoding === 'text') call = call.set('Content-Type', 'text/plain').send(text);
              else if (encoding === 'form') call = call.set('Content-Type', 'application/x-www-form-urlencoded').send('a=1&b=%ZZ');
              else if (encoding === 'invalidUtf8') call = call.set('Content-Type', 'application/json').send(Buffer.from([0x7b, 0x22, 0xff, 0xfe, 0x22, 0x3a, 0x31, 0x7d]));
              else call = call.set('Content-Type', 'application/json').send('{"a": [1, 2');
            }
            const response = await call;
            const where = `${op.method.toUpperCase()} ${path} -> ${response.status}`;
            expect(response.status, where).toBeLessThan(500);
            // 431/414: Node's HTTP parser refuses an oversized request line before the app sees it.
            if (response.status >= 400 && response.status !== 431 && response.status !== 414) {
              expect(response.headers['content-type'], where).toMatch(/json/);
              expect(response.body, where).toMatchObject({ status: response.status, title: expect.any(String), detail: expect.any(String) });
              expect(Array.isArray(response.body.errors), where).toBe(true);
              for (const error of response.body.errors) expect(typeof error.path, where).toBe('string');
              expect(JSON.stringify(response.body), where).not.toMatch(/at [\w.]+ \(|node_modules|SELECT |INSERT /);
            }
          },
        ),
        { numRuns: runsPerRoute, seed: 20261201, endOnFailure: true },
      );
      if (process.env.FUZZ_TIMING) appendFileSync(process.env.FUZZ_TIMING, `${op.method} ${op.path}: ${(performance.now() - started).toFixed(0)} ms\n`);
    }
    const health = await request(app).get('/api/health');
    expect(health.status).toBe(200);
    expect(health.body.database.up).toBe(true);
  }, 600_000);
});
