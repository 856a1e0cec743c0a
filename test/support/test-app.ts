import bcrypt from 'bcryptjs';
import { sql } from 'kysely';
import { pino } from 'pino';
import request from 'supertest';
import type { Role } from '@shared/contracts/user';
import { createApp } from '../../api/app';
import { loadConfig, type Config } from '../../api/config';
import { createDatabase } from '../../api/db/database';
import type { Outbox } from '../../api/mail/outbox';
import { insertUser } from '../../api/users/user.repository';
import { SessionCache } from '../../api/auth/session-cache';

export const TEST_PASSWORD = 'test-password-4711';

/** An app on the throwaway database with fast hashing and the given overrides. */
export function createTestApp(overrides: Partial<Config> = {}, extra: { outbox?: Outbox } = {}) {
  const url = process.env.TEST_DATABASE_URL;
  if (!url) throw new Error('TEST_DATABASE_URL is not set: run the API suites through vitest (global setup starts the database)');
  const config: Config = {
    ...loadConfig({ NODE_ENV: 'test', SESSION_SECRET: 'test-secret-that-is-long-enough-0123456789', BCRYPT_COST: '10', DATABASE_URL: url, SIGN_IN_LIMIT_PER_ADDRESS: '10000', SIGN_IN_LIMIT_PER_ACCOUNT: '10000' }),
    staticDir: 'no-static-dir-in-api-tests',
    ...overrides,
  };
  const db = createDatabase(url, { max: 5, prepared: true });
  // As in the server: live sessions cached, forgotten on every change the database announces.
  const sessions = new SessionCache(url);
  sessions.start();
  const app = createApp({ config, db, logger: pino({ level: 'silent' }), version: 'test', outbox: extra.outbox ?? null, sessions });
  return { app, db, config, sessions };
}

export type TestApp = ReturnType<typeof createTestApp>;

export async function resetTables({ db, sessions }: TestApp): Promise<void> {
  // Tests after this one run with the session cache listening, as the server does.
  await sessions.ready();
  await sql`truncate table audit_events, mailbox_messages, outbox, review_comments, invitations, reviews, design_versions, designs, sessions, users restart identity cascade`.execute(db);
}

let passwordHash: string | undefined;

export async function createAccount({ db }: TestApp, role: Role, email = `${role}-${Math.random().toString(36).slice(2, 8)}@example.com`) {
  passwordHash ??= await bcrypt.hash(TEST_PASSWORD, 10);
  return insertUser(db, { email, display_name: `Test ${role}`, role, password_hash: passwordHash });
}

/** Signs in and returns the Bearer token and the browser cookies of the session. */
export async function signIn(testApp: TestApp, email: string, password = TEST_PASSWORD) {
  const response = await request(testApp.app).post('/api/auth/sign-in').send({ email, password });
  if (response.status !== 200) throw new Error(`sign-in as ${email} failed: ${response.status} ${JSON.stringify(response.body)}`);
  const cookies = ([] as string[]).concat(response.headers['set-cookie'] ?? []);
  const cookieHeader = cookies.map((cookie) => cookie.split(';')[0]).join('; ');
  const csrf = /qb_csrf=([^;]+)/.exec(cookieHeader)?.[1] ?? '';
  return { token: response.body.token as string, cookieHeader, csrf, user: response.body.user };
}
