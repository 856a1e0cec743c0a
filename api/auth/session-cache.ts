import pg from 'pg';
import type { Logger } from 'pino';
import type { UserRow } from '../db/database';

/** The channel the database's triggers (migration 0005) announce a changed account or session on. */
export const AUTH_CHANGES_CHANNEL = 'qb_auth_changes';
/** An entry is looked up again after this long even without a change announced. */
const ENTRY_TTL_MS = 60_000;
const MAX_ENTRIES = 10_000;
const RECONNECT_MS = 1_000;
/** The LISTEN connection is checked this often; one that does not answer within HEARTBEAT_TIMEOUT_MS counts as lost. */
const HEARTBEAT_MS = 10_000;
const HEARTBEAT_TIMEOUT_MS = 5_000;

interface Entry {
  row: UserRow;
  userId: string;
  /** The session's own expiry [ms since epoch]: the cache never outlives it. */
  sessionExpiresAt: number;
  storedAt: number;
}

/**
 * Remembers which sessions are live, so a request need not ask the database each time, and forgets
 * as soon as anything changes:
 * - changes this process makes (sign-out, password change, role change, disabling) call
 *   `forgetUser` before they answer, so they take effect at once;
 * - every change to a users or sessions row, from any process or from SQL, is announced by a
 *   trigger with NOTIFY (PostgreSQL documentation, "NOTIFY"), which this cache LISTENs to and which
 *   arrives within milliseconds of the commit;
 * - the cache is used only while that LISTEN connection is up: when it drops (the database restarts)
 *   the cache empties and every request asks the database until it is listening again.
 * A lookup that started before a change is never stored after it (the generation check).
 */
export class SessionCache {
  private readonly entries = new Map<string, Entry>();
  private generation = 0;
  private listener: pg.Client | null = null;
  private listening = false;
  private stopped = true;
  private retry: NodeJS.Timeout | null = null;
  private heartbeat: NodeJS.Timeout | null = null;

  constructor(
    private readonly connectionString: string,
    private readonly logger?: Logger,
  ) {}

  /** Connects the LISTEN connection (and keeps reconnecting) until `stop`. */
  start(): void {
    if (!this.stopped) return;
    this.stopped = false;
    void this.listen();
  }

  async stop(): Promise<void> {
    this.stopped = true;
    if (this.retry) clearTimeout(this.retry);
    this.retry = null;
    if (this.heartbeat) clearInterval(this.heartbeat);
    this.heartbeat = null;
    this.disable();
    const listener = this.listener;
    this.listener = null;
    await listener?.end().catch(() => undefined);
  }

  /** Resolves once the cache is listening (or after `withinMs`, when it still is not). */
  async ready(withinMs = 5000): Promise<boolean> {
    const deadline = Date.now() + withinMs;
    while (!this.listening && !this.stopped && Date.now() < deadline) await new Promise((resolve) => setTimeout(resolve, 10));
    return this.listening;
  }

  /** Whether lookups are served from memory now. */
  get active(): boolean {
    return this.listening;
  }

  get(sessionId: string): UserRow | undefined {
    if (!this.listening) return undefined;
    const entry = this.entries.get(sessionId);
    if (!entry) return undefined;
    const now = Date.now();
    if (now >= entry.sessionExpiresAt || now - entry.storedAt > ENTRY_TTL_MS) {
      this.entries.delete(sessionId);
      return undefined;
    }
    return entry.row;
  }

  /** A token for `store`: taken before the database lookup whose result is to be stored. */
  ticket(): number {
    return this.generation;
  }

  store(ticket: number, sessionId: string, row: UserRow, sessionExpiresAt: Date): void {
    if (!this.listening || ticket !== this.generation) return;
    if (this.entries.size >= MAX_ENTRIES) this.entries.delete(this.entries.keys().next().value!);
    this.entries.set(sessionId, { row, userId: row.id, sessionExpiresAt: sessionExpiresAt.getTime(), storedAt: Date.now() });
  }

  /** Forgets every session of the account (after any change to it or to one of its sessions). */
  forgetUser(userId: string): void {
    this.generation += 1;
    for (const [sessionId, entry] of this.entries) if (entry.userId === userId) this.entries.delete(sessionId);
  }

  forgetAll(): void {
    this.generation += 1;
    this.entries.clear();
  }

  private disable(): void {
    this.listening = false;
    this.generation += 1;
    this.entries.clear();
  }

  private async listen(): Promise<void> {
    if (this.stopped) return;
    const client = new pg.Client({ connectionString: this.connectionString, connectionTimeoutMillis: 5000 });
    this.listener = client;
    const lost = (error?: unknown) => {
      if (this.listener !== client) return;
      this.listener = null;
      if (this.heartbeat) clearInterval(this.heartbeat);
      this.heartbeat = null;
      this.disable();
      if (error) this.logger?.warn({ err: error }, 'session cache: the LISTEN connection is lost; asking the database on every request until it is back');
      void client.end().catch(() => undefined);
      this.scheduleReconnect();
    };
    client.on('error', lost);
    client.on('end', () => lost());
    client.on('notification', (message) => {
      if (message.channel !== AUTH_CHANGES_CHANNEL || !message.payload) return;
      if (message.payload === '*') this.forgetAll();
      else this.forgetUser(message.payload);
    });
    try {
      await client.connect();
      await client.query(`listen ${AUTH_CHANGES_CHANNEL}`);
      if (this.listener !== client || this.stopped) return;
      // The socket must not keep the process alive on its own (tests, scripts).
      (client as unknown as { connection?: { stream?: { unref?: () => void } } }).connection?.stream?.unref?.();
      this.entries.clear();
      this.generation += 1;
      this.listening = true;
      // A link that died without a word (no reset) would otherwise go unnoticed, and with it the notices.
      this.heartbeat = setInterval(() => {
        const timer = setTimeout(() => lost(new Error('the LISTEN connection did not answer its heartbeat')), HEARTBEAT_TIMEOUT_MS);
        timer.unref();
        client.query('select 1').then(() => clearTimeout(timer), (error: unknown) => {
          clearTimeout(timer);
          lost(error);
        });
      }, HEARTBEAT_MS);
      this.heartbeat.unref();
    } catch (error) {
      lost(error);
    }
  }

  private scheduleReconnect(): void {
    if (this.stopped || this.retry) return;
    this.retry = setTimeout(() => {
      this.retry = null;
      void this.listen();
    }, RECONNECT_MS);
    this.retry.unref();
  }
}
