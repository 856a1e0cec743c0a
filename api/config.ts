import { randomBytes } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { z } from 'zod';
import { formatIssuePath } from '@shared/contracts/problem';

const projectRoot = fileURLToPath(new URL('..', import.meta.url));
const DEFAULT_PGPORT = 54329;

const booleanFromEnv = z
  .enum(['true', 'false', '1', '0', 'yes', 'no'], { error: 'must be true or false' })
  .transform((value) => value === 'true' || value === '1' || value === 'yes');

const environmentSchema = z.object({
  NODE_ENV: z.enum(['development', 'production', 'test'], { error: 'must be development, production or test' }).default('development'),
  HOST: z.string().min(1).default('127.0.0.1'),
  PORT: z.coerce.number({ error: 'must be a port number' }).int().min(1).max(65535).default(4200),
  PGPORT: z.coerce.number({ error: 'must be a port number' }).int().min(1).max(65535).default(DEFAULT_PGPORT),
  DATABASE_URL: z.string().url('must be a postgres:// URL').optional(),
  SESSION_SECRET: z.string().min(32, 'must be at least 32 characters').optional(),
  SESSION_TTL_HOURS: z.coerce.number({ error: 'must be a number of hours' }).positive().max(24 * 30).default(12),
  COOKIE_SECURE: booleanFromEnv.optional(),
  BCRYPT_COST: z.coerce.number({ error: 'must be a whole number' }).int().min(10, 'must be at least 10').max(15).default(12),
  BODY_LIMIT: z.string().default('2mb'),
  LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).default('info'),
  STATIC_DIR: z.string().default(fileURLToPath(new URL('../dist/quietbridge/browser', import.meta.url))),
  TRUST_PROXY: z.string().optional(),
  SIGN_IN_LIMIT_PER_ADDRESS: z.coerce.number().int().positive().default(30),
  SIGN_IN_LIMIT_PER_ACCOUNT: z.coerce.number().int().positive().default(8),
  SIGN_IN_WINDOW_MINUTES: z.coerce.number().positive().default(15),
  SMTP_URL: z.string().url('must be an smtp:// or smtps:// URL').optional(),
  MAIL_CATCHER_PORT: z.coerce.number({ error: 'must be a port number' }).int().min(1).max(65535).default(2525),
  MAIL_FROM: z.string().min(3).default('Quietbridge <quietbridge@localhost>'),
  PUBLIC_URL: z.string().url('must be the URL people open, e.g. https://quietbridge.example.com').optional(),
  INVITATION_TTL_DAYS: z.coerce.number().positive().max(90).default(7),
});

export interface Config {
  env: 'development' | 'production' | 'test';
  host: string;
  port: number;
  databaseUrl: string;
  sessionSecret: string;
  sessionTtlSeconds: number;
  cookieSecure: boolean;
  bcryptCost: number;
  bodyLimit: string;
  logLevel: string;
  staticDir: string;
  trustProxy: string | undefined;
  signInLimit: { perAddress: number; perAccount: number; windowMs: number };
  mail: { smtpUrl: string; from: string; catcherPort: number };
  /** Base of the links in e-mails. */
  publicUrl: string;
  invitationTtlMs: number;
}

export class ConfigError extends Error {}

/** The local secret: generated once, kept under .data/ so sessions survive a restart. */
function localSessionSecret(): string {
  const dataDir = `${projectRoot}.data`;
  const file = `${dataDir}/session-secret`;
  if (existsSync(file)) return readFileSync(file, 'utf8').trim();
  mkdirSync(dataDir, { recursive: true });
  const secret = randomBytes(48).toString('base64url');
  writeFileSync(file, `${secret}\n`, { mode: 0o600 });
  return secret;
}

/** Reads the configuration once from the environment; stops with a message naming each bad variable. */
export function loadConfig(environment: NodeJS.ProcessEnv = process.env): Config {
  const parsed = environmentSchema.safeParse(environment);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((issue) => `  ${formatIssuePath(issue.path)}: ${issue.message}`);
    throw new ConfigError(`Invalid configuration in the environment:\n${lines.join('\n')}`);
  }
  const e = parsed.data;
  if (e.NODE_ENV === 'production' && !e.SESSION_SECRET) {
    throw new ConfigError(
      'SESSION_SECRET is required in production (NODE_ENV=production): set it to a random string of at least 32 characters, ' +
        'the same on every API replica, e.g. `openssl rand -base64 48`.',
    );
  }
  return {
    env: e.NODE_ENV,
    host: e.HOST,
    port: e.PORT,
    databaseUrl: e.DATABASE_URL ?? `postgres://app@127.0.0.1:${e.PGPORT}/quietbridge`,
    sessionSecret: e.SESSION_SECRET ?? localSessionSecret(),
    sessionTtlSeconds: Math.round(e.SESSION_TTL_HOURS * 3600),
    cookieSecure: e.COOKIE_SECURE ?? e.NODE_ENV === 'production',
    bcryptCost: e.BCRYPT_COST,
    bodyLimit: e.BODY_LIMIT,
    logLevel: e.LOG_LEVEL,
    staticDir: e.STATIC_DIR,
    trustProxy: e.TRUST_PROXY,
    signInLimit: {
      perAddress: e.SIGN_IN_LIMIT_PER_ADDRESS,
      perAccount: e.SIGN_IN_LIMIT_PER_ACCOUNT,
      windowMs: Math.round(e.SIGN_IN_WINDOW_MINUTES * 60_000),
    },
    mail: {
      smtpUrl: e.SMTP_URL ?? `smtp://127.0.0.1:${e.MAIL_CATCHER_PORT}`,
      from: e.MAIL_FROM,
      catcherPort: e.MAIL_CATCHER_PORT,
    },
    publicUrl: (e.PUBLIC_URL ?? `http://${e.HOST}:${e.PORT}`).replace(/\/+$/, ''),
    invitationTtlMs: Math.round(e.INVITATION_TTL_DAYS * 24 * 3600 * 1000),
  };
}
