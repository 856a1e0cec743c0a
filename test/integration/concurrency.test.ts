import type { AddressInfo } from 'node:net';
import type { Server } from 'node:http';
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import demoPressure from '@shared/examples/demo-pressure.json';
import { createInvitation } from '../../api/reviews/invitation.service';
import { sessionOf, storeDesign, storeReview } from '../support/fixtures';
import { createAccount, createTestApp, resetTables, TEST_PASSWORD } from '../support/test-app';

// Many clients at once against one listening server (real sockets, the app's own pool): whatever
// the API acknowledged is stored exactly once, nothing else is, and races have exactly one winner.

const CLIENTS = 50;
const testApp = createTestApp();
const { db } = testApp;
let server: Server;
let base = '';

beforeAll(async () => {
  server = testApp.app.listen(0, '127.0.0.1');
  await new Promise((resolve) => server.once('listening', resolve));
  base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
});

afterAll(async () => {
  await new Promise((resolve) => server.close(resolve));
  await db.destroy();
});

beforeEach(async () => {
  await resetTables(testApp);
});

async function call(method: string, path: string, auth: Record<string, string>, body?: unknown): Promise<{ status: number; body: Record<string, unknown> }> {
  const response = await fetch(`${base}${path}`, {
    method,
    headers: { ...auth, ...(body === undefined ? {} : { 'Content-Type': 'application/json' }) },
    body: body === undefined ? undefined : JSON.stringify(body),
  });
  const text = await response.text();
  return { status: response.status, body: text ? (JSON.parse(text) as Record<string, unknown>) : {} };
}

/** Client i's document: its marker in the notes and its own excitation frequency, so a mixed document shows. */
function documentOf(marker: string, i: number) {
  return { ...demoPressure, notes: marker, excitation: { ...demoPressure.excitation, frequency: 40_000 + 100 * i } };
}

async function storedVersions(designId: string) {
  const rows = await db.selectFrom('design_versions').select(['number', 'message', 'document']).where('design_id', '=', designId).orderBy('number').execute();
  return rows.map((row) => ({
    number: row.number,
    message: row.message,
    notes: (row.document as { notes: string }).notes,
    frequency: (row.document as { excitation: { frequency: number } }).excitation.frequency,
  }));
}

describe('concurrent saves of one design', () => {
  it('on the same base: one winner, every other client 409 with the latest version, nothing else stored', async () => {
    const owner = await createAccount(testApp, 'designer');
    const auth = await sessionOf(testApp, owner);
    const designId = await storeDesign(testApp, owner, 'Line sensor');
    const results = await Promise.all(
      Array.from({ length: CLIENTS }, (_, i) => call('POST', `/api/designs/${designId}/versions`, auth, { document: documentOf(`client-${i}`, i), message: `client-${i}`, baseVersion: 1 })),
    );
    const statuses = results.map((r) => r.status);
    expect(statuses.filter((s) => s === 201)).toHaveLength(1);
    expect(statuses.filter((s) => s === 409)).toHaveLength(CLIENTS - 1);
    for (const loser of results.filter((r) => r.status === 409)) expect(loser.body).toMatchObject({ status: 409, latestVersion: 2 });

    const winner = results.findIndex((r) => r.status === 201);
    expect(results[winner]!.body).toMatchObject({ number: 2, message: `client-${winner}` });
    const stored = await storedVersions(designId);
    expect(stored.map((v) => v.number)).toEqual([1, 2]);
    expect(stored[1]).toEqual({ number: 2, message: `client-${winner}`, notes: `client-${winner}`, frequency: 40_000 + 100 * winner });
    const design = await db.selectFrom('designs').select('latest_version').where('id', '=', designId).executeTakeFirstOrThrow();
    expect(design.latest_version).toBe(2);
  });

  it('retrying on 409 with the latest base: every client lands once, numbers unique and gapless, no document lost or mixed', async () => {
    const owner = await createAccount(testApp, 'designer');
    const auth = await sessionOf(testApp, owner);
    const designId = await storeDesign(testApp, owner, 'Line sensor');
    const acknowledged = new Map<string, number>();
    let conflicts = 0;

    async function client(i: number) {
      const marker = `client-${i}`;
      let baseVersion = 1;
      for (let attempt = 0; attempt < 10 * CLIENTS; attempt += 1) {
        const result = await call('POST', `/api/designs/${designId}/versions`, auth, { document: documentOf(marker, i), message: marker, baseVersion });
        if (result.status === 201) {
          acknowledged.set(marker, result.body['number'] as number);
          return;
        }
        expect(result.status, JSON.stringify(result.body)).toBe(409);
        conflicts += 1;
        baseVersion = result.body['latestVersion'] as number;
      }
      throw new Error(`${marker} never landed`);
    }
    await Promise.all(Array.from({ length: CLIENTS }, (_, i) => client(i)));

    expect(acknowledged.size).toBe(CLIENTS);
    expect(conflicts).toBeGreaterThan(0);
    const stored = await storedVersions(designId);
    expect(stored.map((v) => v.number)).toEqual(Array.from({ length: CLIENTS + 1 }, (_, i) => i + 1));
    for (const version of stored.slice(1)) {
      const i = Number(version.message.slice('client-'.length));
      expect(version).toEqual({ number: acknowledged.get(version.message), message: `client-${i}`, notes: `client-${i}`, frequency: 40_000 + 100 * i });
    }
    expect(new Set(stored.slice(1).map((v) => v.message)).size).toBe(CLIENTS);

    const saved = await db.selectFrom('audit_events').select('version_number').where('design_id', '=', designId).where('action', '=', 'saved').orderBy('version_number').execute();
    expect(saved.map((e) => e.version_number)).toEqual(stored.slice(1).map((v) => v.number));
    const design = await db.selectFrom('designs').select('latest_version').where('id', '=', designId).executeTakeFirstOrThrow();
    expect(design.latest_version).toBe(CLIENTS + 1);
  }, 60_000);
});

describe('concurrent review activity', () => {
  async function sharedReview() {
    const [owner, reviewer] = await Promise.all([createAccount(testApp, 'designer'), createAccount(testApp, 'reviewer')]);
    const designId = await storeDesign(testApp, owner, 'Line sensor');
    const { reviewId } = await storeReview(testApp, designId, owner, reviewer);
    return { owner, reviewer, designId, reviewId, ownerAuth: await sessionOf(testApp, owner), reviewerAuth: await sessionOf(testApp, reviewer) };
  }

  it('stores all of 50 comments posted at once by the reviewer and the designer', async () => {
    const { reviewId, designId, ownerAuth, reviewerAuth } = await sharedReview();
    const results = await Promise.all(
      Array.from({ length: CLIENTS }, (_, i) => call('POST', `/api/reviews/${reviewId}/comments`, i % 2 ? ownerAuth : reviewerAuth, { body: `comment-${i}`, stage: 'lp' })),
    );
    expect(results.map((r) => r.status)).toEqual(results.map(() => 201));
    const ids = new Set(results.map((r) => r.body['id']));
    expect(ids.size).toBe(CLIENTS);

    const stored = await db.selectFrom('review_comments').select(['id', 'body']).where('review_id', '=', reviewId).where('body', 'like', 'comment-%').execute();
    expect(stored.map((c) => c.body).sort()).toEqual(Array.from({ length: CLIENTS }, (_, i) => `comment-${i}`).sort());
    expect(new Set(stored.map((c) => c.id))).toEqual(ids);
    const detail = await call('GET', `/api/reviews/${reviewId}`, reviewerAuth);
    expect((detail.body['comments'] as unknown[]).length).toBe(CLIENTS + 1);
    const events = await db.selectFrom('audit_events').select('id').where('design_id', '=', designId).where('action', '=', 'commented').execute();
    expect(events).toHaveLength(CLIENTS);
  });

  it('lets exactly one of 50 simultaneous decisions win; the rest get 409 and nothing of theirs is kept', async () => {
    const { reviewId, designId, reviewerAuth } = await sharedReview();
    const results = await Promise.all(
      Array.from({ length: CLIENTS }, (_, i) =>
        call('POST', `/api/reviews/${reviewId}/decision`, reviewerAuth, { decision: i % 2 ? 'approved' : 'changes_requested', note: `decision-${i}` }),
      ),
    );
    const winners = results.flatMap((r, i) => (r.status === 200 ? [i] : []));
    expect(winners).toHaveLength(1);
    expect(results.filter((r) => r.status === 409)).toHaveLength(CLIENTS - 1);
    const winner = winners[0]!;
    const review = await db.selectFrom('reviews').select(['state', 'decision_note']).where('id', '=', reviewId).executeTakeFirstOrThrow();
    expect(review).toEqual({ state: winner % 2 ? 'approved' : 'changes_requested', decision_note: `decision-${winner}` });
    const mails = await db.selectFrom('outbox').select('subject').where('review_id', '=', reviewId).execute();
    expect(mails).toHaveLength(1);
    const events = await db.selectFrom('audit_events').select('detail').where('design_id', '=', designId).where('action', '=', 'decided').execute();
    expect(events.map((e) => (e.detail as { note: string }).note)).toEqual([`decision-${winner}`]);
  });

  it('accepts a one-time invitation link once when it is used from several places at once', async () => {
    const owner = await createAccount(testApp, 'designer');
    const { token } = await db.transaction().execute((trx) => createInvitation(trx, 'newcomer@example.com', owner.id, 3600_000));
    const results = await Promise.all(
      Array.from({ length: 10 }, (_, i) => call('POST', `/api/invitations/${token}/accept`, {}, { displayName: `Newcomer ${i}`, password: TEST_PASSWORD })),
    );
    const statuses = results.map((r) => r.status);
    expect(statuses.filter((s) => s === 201)).toHaveLength(1);
    expect(statuses.filter((s) => s !== 201).every((s) => s === 410 || s === 409)).toBe(true);
    const accounts = await db.selectFrom('users').select('email').where('email', '=', 'newcomer@example.com').execute();
    expect(accounts).toHaveLength(1);
  });
});
