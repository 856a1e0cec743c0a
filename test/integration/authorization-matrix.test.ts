import jwt from 'jsonwebtoken';
import { sql } from 'kysely';
import request from 'supertest';
import { afterAll, describe, expect, it } from 'vitest';
import demoPressure from '@shared/examples/demo-pressure.json';
import { operations } from '../../api/app';
import type { UserRow } from '../../api/db/database';
import { createInvitation } from '../../api/reviews/invitation.service';
import { sessionOf, storeDataset, storeDesign, storeReview } from '../support/fixtures';
import { createAccount, createTestApp, resetTables, signIn, TEST_PASSWORD } from '../support/test-app';

// Every route in `operations` x every role x, where it applies, whose resource it is. The expected
// status of each cell is written out below; a route without a row fails the first test.
//
// Ownership, seen from the caller:
//   own     the caller's own design (its reviews, datasets), or the caller's own account;
//   others  someone else's design, not shared with the caller (its review is between two others),
//           or someone else's account;
//   shared  someone else's design whose version 1 is shared with the caller for review.
// Reviewers own no designs; a signed-out caller is tried on someone else's resource.

const testApp = createTestApp();
const { app } = testApp;

afterAll(async () => {
  await testApp.db.destroy();
});

type Actor = 'admin' | 'designer' | 'reviewer' | 'anonymous';
type Kind = 'own' | 'others' | 'shared';
type Scope = 'none' | 'design' | 'review' | 'account';
type Cells = number | Partial<Record<Kind, number>>;

const actors: Actor[] = ['admin', 'designer', 'reviewer', 'anonymous'];
const kindsOf: Record<Exclude<Scope, 'none'>, Record<Actor, Kind[]>> = {
  design: { admin: ['own', 'others', 'shared'], designer: ['own', 'others', 'shared'], reviewer: ['others', 'shared'], anonymous: ['others'] },
  review: { admin: ['own', 'others', 'shared'], designer: ['own', 'others', 'shared'], reviewer: ['others', 'shared'], anonymous: ['others'] },
  account: { admin: ['own', 'others'], designer: ['own', 'others'], reviewer: ['own', 'others'], anonymous: ['others'] },
};

/** What one cell sends: the path parameters and the body (JSON, or a multipart CSV upload). */
interface Target {
  id: string;
  number: string;
  datasetId: string;
  commentId: string;
  token: string;
}

interface Row {
  scope: Scope;
  expected: Record<Actor, Cells>;
  body?: (world: World) => object;
  upload?: boolean;
}

interface World {
  accounts: Record<'admin' | 'designer' | 'reviewer' | 'otherDesigner' | 'otherReviewer', UserRow>;
  auth: Record<Exclude<Actor, 'anonymous'>, { Authorization: string } | undefined> & { anonymous: undefined };
  /** Designs by ownership as the admin and the designer see them; `others` and `shared` are the other designer's. */
  designs: { admin: string; designer: string; others: string; shared: string };
  reviews: { own: Record<'admin' | 'designer', { reviewId: string; commentId: string }>; others: { reviewId: string; commentId: string }; shared: Record<'admin' | 'designer' | 'reviewer', { reviewId: string; commentId: string }> };
  datasets: Record<string, string>;
  invitationToken: string;
  mailboxMessageId: string;
}

const csv = ['cell,run,dir,pressure,output', 'A,1,up,0,1.5', 'A,1,up,30,151.0', 'A,1,up,60,300.5', 'A,1,down,60,300.9', 'A,1,down,30,151.8', 'A,1,down,0,1.9'].join('\n');
const mapping = { referenceColumn: 'pressure', referenceUnit: 'kPa', readoutColumn: 'output', readoutUnit: 'mV', cellColumn: 'cell', runColumn: 'run', directionColumn: 'dir' };

let serial = 0;
const unique = () => (serial += 1);

const table: Record<string, Row> = {
  'GET /api/health': { scope: 'none', expected: { admin: 200, designer: 200, reviewer: 200, anonymous: 200 } },

  'POST /api/auth/sign-in': {
    scope: 'none',
    expected: { admin: 200, designer: 200, reviewer: 200, anonymous: 200 },
    body: (w) => ({ email: w.accounts.designer.email, password: TEST_PASSWORD }),
  },
  'POST /api/auth/sign-out': { scope: 'none', expected: { admin: 204, designer: 204, reviewer: 204, anonymous: 401 } },
  'GET /api/auth/me': { scope: 'none', expected: { admin: 200, designer: 200, reviewer: 200, anonymous: 401 } },
  'POST /api/auth/password': {
    scope: 'none',
    expected: { admin: 204, designer: 204, reviewer: 204, anonymous: 401 },
    body: () => ({ currentPassword: TEST_PASSWORD, newPassword: 'another-long-secret-42' }),
  },

  'GET /api/users': { scope: 'none', expected: { admin: 200, designer: 403, reviewer: 403, anonymous: 401 } },
  'POST /api/users': {
    scope: 'none',
    expected: { admin: 201, designer: 403, reviewer: 403, anonymous: 401 },
    body: () => ({ email: `new-${unique()}@example.com`, displayName: 'New Colleague', role: 'designer', password: 'a-fine-long-password' }),
  },
  'PATCH /api/users/{id}': {
    scope: 'account',
    expected: { admin: { own: 200, others: 200 }, designer: { own: 403, others: 403 }, reviewer: { own: 403, others: 403 }, anonymous: { others: 401 } },
    body: () => ({ displayName: 'Renamed Colleague' }),
  },

  'GET /api/designs': { scope: 'none', expected: { admin: 200, designer: 200, reviewer: 200, anonymous: 401 } },
  'POST /api/designs': {
    scope: 'none',
    expected: { admin: 201, designer: 201, reviewer: 403, anonymous: 401 },
    body: () => ({ name: 'Another line sensor', document: demoPressure }),
  },
  'GET /api/designs/{id}': {
    scope: 'design',
    expected: { admin: { own: 200, others: 200, shared: 200 }, designer: { own: 200, others: 404, shared: 404 }, reviewer: { others: 404, shared: 404 }, anonymous: { others: 401 } },
  },
  'PATCH /api/designs/{id}': {
    scope: 'design',
    expected: { admin: { own: 200, others: 200, shared: 200 }, designer: { own: 200, others: 404, shared: 404 }, reviewer: { others: 404, shared: 404 }, anonymous: { others: 401 } },
    body: () => ({ name: 'Renamed line sensor' }),
  },
  'GET /api/designs/{id}/versions': {
    scope: 'design',
    expected: { admin: { own: 200, others: 200, shared: 200 }, designer: { own: 200, others: 404, shared: 404 }, reviewer: { others: 404, shared: 404 }, anonymous: { others: 401 } },
  },
  'POST /api/designs/{id}/versions': {
    scope: 'design',
    expected: { admin: { own: 201, others: 201, shared: 201 }, designer: { own: 201, others: 404, shared: 404 }, reviewer: { others: 404, shared: 404 }, anonymous: { others: 401 } },
    body: () => ({ document: demoPressure, message: 'Second version', baseVersion: 1 }),
  },
  'GET /api/designs/{id}/versions/{number}': {
    scope: 'design',
    expected: { admin: { own: 200, others: 200, shared: 200 }, designer: { own: 200, others: 404, shared: 404 }, reviewer: { others: 404, shared: 404 }, anonymous: { others: 401 } },
  },

  'POST /api/designs/{id}/versions/{number}/reviews': {
    scope: 'design',
    expected: { admin: { own: 201, others: 201, shared: 201 }, designer: { own: 201, others: 404, shared: 404 }, reviewer: { others: 403, shared: 403 }, anonymous: { others: 401 } },
    body: () => ({ reviewerEmail: `colleague-${unique()}@example.com` }),
  },
  'GET /api/designs/{id}/reviews': {
    scope: 'design',
    expected: { admin: { own: 200, others: 200, shared: 200 }, designer: { own: 200, others: 404, shared: 404 }, reviewer: { others: 404, shared: 404 }, anonymous: { others: 401 } },
  },
  'GET /api/reviews': { scope: 'none', expected: { admin: 200, designer: 200, reviewer: 200, anonymous: 401 } },
  'GET /api/reviews/{id}': {
    scope: 'review',
    expected: { admin: { own: 200, others: 200, shared: 200 }, designer: { own: 200, others: 404, shared: 200 }, reviewer: { others: 404, shared: 200 }, anonymous: { others: 401 } },
  },
  'POST /api/reviews/{id}/comments': {
    scope: 'review',
    expected: { admin: { own: 201, others: 201, shared: 201 }, designer: { own: 201, others: 404, shared: 201 }, reviewer: { others: 404, shared: 201 }, anonymous: { others: 401 } },
    body: () => ({ body: 'The corner sits close to the ripple' }),
  },
  'PATCH /api/reviews/{id}/comments/{commentId}': {
    scope: 'review',
    expected: { admin: { own: 200, others: 200, shared: 200 }, designer: { own: 200, others: 404, shared: 200 }, reviewer: { others: 404, shared: 200 }, anonymous: { others: 401 } },
    body: () => ({ resolved: true }),
  },
  'POST /api/reviews/{id}/decision': {
    scope: 'review',
    expected: { admin: { own: 403, others: 403, shared: 200 }, designer: { own: 403, others: 404, shared: 200 }, reviewer: { others: 404, shared: 200 }, anonymous: { others: 401 } },
    body: () => ({ decision: 'approved', note: 'Fine' }),
  },
  'GET /api/invitations/{token}': { scope: 'none', expected: { admin: 200, designer: 200, reviewer: 200, anonymous: 200 } },
  'POST /api/invitations/{token}/accept': {
    scope: 'none',
    expected: { admin: 201, designer: 201, reviewer: 201, anonymous: 201 },
    body: () => ({ displayName: 'Invited Reviewer', password: TEST_PASSWORD }),
  },
  'GET /api/designs/{id}/audit': {
    scope: 'design',
    expected: { admin: { own: 200, others: 200, shared: 200 }, designer: { own: 200, others: 404, shared: 404 }, reviewer: { others: 403, shared: 403 }, anonymous: { others: 401 } },
  },
  'GET /api/designs/{id}/versions/{number}/report': {
    scope: 'design',
    expected: { admin: { own: 200, others: 200, shared: 200 }, designer: { own: 200, others: 404, shared: 200 }, reviewer: { others: 404, shared: 200 }, anonymous: { others: 401 } },
  },
  'GET /api/mailbox': { scope: 'none', expected: { admin: 200, designer: 403, reviewer: 403, anonymous: 401 } },
  'GET /api/mailbox/{id}': { scope: 'none', expected: { admin: 200, designer: 403, reviewer: 403, anonymous: 401 } },

  'GET /api/designs/{id}/datasets': {
    scope: 'design',
    expected: { admin: { own: 200, others: 200, shared: 200 }, designer: { own: 200, others: 404, shared: 404 }, reviewer: { others: 404, shared: 404 }, anonymous: { others: 401 } },
  },
  'POST /api/designs/{id}/datasets/preview': {
    scope: 'design',
    expected: { admin: { own: 200, others: 200, shared: 200 }, designer: { own: 200, others: 404, shared: 404 }, reviewer: { others: 404, shared: 404 }, anonymous: { others: 401 } },
    upload: true,
  },
  'POST /api/designs/{id}/datasets': {
    scope: 'design',
    expected: { admin: { own: 201, others: 201, shared: 201 }, designer: { own: 201, others: 404, shared: 404 }, reviewer: { others: 404, shared: 404 }, anonymous: { others: 401 } },
    upload: true,
  },
  'GET /api/designs/{id}/datasets/{datasetId}': {
    scope: 'design',
    expected: { admin: { own: 200, others: 200, shared: 200 }, designer: { own: 200, others: 404, shared: 404 }, reviewer: { others: 404, shared: 404 }, anonymous: { others: 401 } },
  },
  'GET /api/designs/{id}/datasets/{datasetId}/file': {
    scope: 'design',
    expected: { admin: { own: 200, others: 200, shared: 200 }, designer: { own: 200, others: 404, shared: 404 }, reviewer: { others: 404, shared: 404 }, anonymous: { others: 401 } },
  },
  'DELETE /api/designs/{id}/datasets/{datasetId}': {
    scope: 'design',
    expected: { admin: { own: 204, others: 204, shared: 204 }, designer: { own: 204, others: 404, shared: 404 }, reviewer: { others: 404, shared: 404 }, anonymous: { others: 401 } },
  },
};

/**
 * The accounts and resources every cell starts from: the admin and the designer each own a
 * design; the other designer owns one shared with nobody but the other reviewer, and one whose
 * version 1 is shared with the admin, the designer and the reviewer.
 */
async function buildWorld(): Promise<World> {
  await resetTables(testApp);
  const [admin, designer, reviewer, otherDesigner, otherReviewer] = await Promise.all([
    createAccount(testApp, 'admin', 'ada@example.com'),
    createAccount(testApp, 'designer', 'dana@example.com'),
    createAccount(testApp, 'reviewer', 'rita@example.com'),
    createAccount(testApp, 'designer', 'otto@example.com'),
    createAccount(testApp, 'reviewer', 'rolf@example.com'),
  ]);
  const [adminDesign, designerDesign, othersDesign, sharedDesign] = await Promise.all([
    storeDesign(testApp, admin, 'Admin line sensor'),
    storeDesign(testApp, designer, 'Dana line sensor'),
    storeDesign(testApp, otherDesigner, 'Otto private sensor'),
    storeDesign(testApp, otherDesigner, 'Otto shared sensor'),
  ]);
  const [ownAdmin, ownDesigner, others, sharedAdmin, sharedDesigner, sharedReviewer] = await Promise.all([
    storeReview(testApp, adminDesign, admin, otherReviewer),
    storeReview(testApp, designerDesign, designer, otherReviewer),
    storeReview(testApp, othersDesign, otherDesigner, otherReviewer),
    storeReview(testApp, sharedDesign, otherDesigner, admin),
    storeReview(testApp, sharedDesign, otherDesigner, designer),
    storeReview(testApp, sharedDesign, otherDesigner, reviewer),
  ]);
  const datasets: Record<string, string> = {};
  for (const [designId, owner] of [[adminDesign, admin], [designerDesign, designer], [othersDesign, otherDesigner], [sharedDesign, otherDesigner]] as const) {
    datasets[designId] = await storeDataset(testApp, designId, owner);
  }
  const invitation = await testApp.db.transaction().execute((trx) => createInvitation(trx, `invited-${unique()}@example.com`, otherDesigner.id, 3600_000));
  const message = await testApp.db
    .insertInto('mailbox_messages')
    .values({ envelope_from: 'qb@localhost', recipients: ['rita@example.com'], subject: 'Review requested', text_body: 'Open the review', html_body: '', raw: '' })
    .returning('id')
    .executeTakeFirstOrThrow();
  const [adminAuth, designerAuth, reviewerAuth] = await Promise.all([sessionOf(testApp, admin), sessionOf(testApp, designer), sessionOf(testApp, reviewer)]);
  return {
    accounts: { admin, designer, reviewer, otherDesigner, otherReviewer },
    auth: { admin: adminAuth, designer: designerAuth, reviewer: reviewerAuth, anonymous: undefined },
    designs: { admin: adminDesign, designer: designerDesign, others: othersDesign, shared: sharedDesign },
    reviews: { own: { admin: ownAdmin, designer: ownDesigner }, others, shared: { admin: sharedAdmin, designer: sharedDesigner, reviewer: sharedReviewer } },
    datasets,
    invitationToken: invitation.token,
    mailboxMessageId: message.id,
  };
}

function targetOf(world: World, scope: Scope, actor: Actor, kind: Kind | null): Target {
  const base = { id: '', number: '1', datasetId: '', commentId: '', token: world.invitationToken };
  if (scope === 'design') {
    const id = kind === 'own' ? world.designs[actor as 'admin' | 'designer'] : world.designs[kind as 'others' | 'shared'];
    return { ...base, id, datasetId: world.datasets[id]! };
  }
  if (scope === 'review') {
    const review = kind === 'own' ? world.reviews.own[actor as 'admin' | 'designer'] : kind === 'others' ? world.reviews.others : world.reviews.shared[actor as 'admin' | 'designer' | 'reviewer'];
    return { ...base, id: review.reviewId, commentId: review.commentId };
  }
  if (scope === 'account') {
    return { ...base, id: kind === 'own' ? world.accounts[actor as 'admin' | 'designer' | 'reviewer'].id : world.accounts.otherDesigner.id };
  }
  return { ...base, id: world.mailboxMessageId };
}

let world: World | null = null;

async function statusOf(route: string, row: Row, actor: Actor, kind: Kind | null): Promise<number> {
  const current = (world ??= await buildWorld());
  // Whatever a state-changing cell did, the next cell starts from a fresh world.
  const [method, template] = route.split(' ') as [string, string];
  if (method !== 'GET') world = null;
  const target = targetOf(current, row.scope, actor, kind);
  const path = template.replace(/\{(\w+)\}/g, (_match, name: keyof Target) => encodeURIComponent(target[name]));
  let call = request(app)[method.toLowerCase() as 'get' | 'post' | 'patch' | 'delete'](path);
  const auth = current.auth[actor];
  if (auth) call = call.set(auth);
  if (row.upload) {
    for (const [name, value] of Object.entries(mapping)) call = call.field(name, value);
    call = call.attach('file', Buffer.from(csv), { filename: 'bench.csv', contentType: 'text/csv' });
  } else if (row.body) {
    call = call.send(row.body(current));
  }
  return (await call).status;
}

async function actualCells(route: string, row: Row): Promise<Record<Actor, Cells>> {
  const cells = {} as Record<Actor, Cells>;
  for (const actor of actors) {
    if (row.scope === 'none') {
      cells[actor] = await statusOf(route, row, actor, null);
      continue;
    }
    const byKind: Partial<Record<Kind, number>> = {};
    for (const kind of kindsOf[row.scope][actor]) byKind[kind] = await statusOf(route, row, actor, kind);
    cells[actor] = byKind;
  }
  return cells;
}

describe('authorization matrix', () => {
  it('has a row for every route in operations, and only for those', () => {
    const routes = operations.map((op) => `${op.method.toUpperCase()} ${op.path}`).sort();
    expect(Object.keys(table).sort()).toEqual(routes);
  });

  it('writes out each role, and for scoped routes each ownership that applies to the role', () => {
    for (const [route, row] of Object.entries(table)) {
      expect(Object.keys(row.expected).sort(), route).toEqual([...actors].sort());
      if (row.scope === 'none') continue;
      for (const actor of actors) expect(Object.keys(row.expected[actor] as object).sort(), `${route} as ${actor}`).toEqual([...kindsOf[row.scope][actor]].sort());
    }
  });

  it('matches the role each route declares in operations', () => {
    for (const op of operations) {
      const row = table[`${op.method.toUpperCase()} ${op.path}`]!;
      const anonymous = row.expected.anonymous;
      const anonymousStatuses = typeof anonymous === 'number' ? [anonymous] : Object.values(anonymous);
      if (op.access === 'public') expect(anonymousStatuses.every((status) => status !== 401), op.path).toBe(true);
      else expect(anonymousStatuses, op.path).toEqual(anonymousStatuses.map(() => 401));
      if (Array.isArray(op.access)) {
        for (const actor of ['admin', 'designer', 'reviewer'] as const) {
          if (op.access.includes(actor)) continue;
          const cells = row.expected[actor];
          expect(typeof cells === 'number' ? [cells] : Object.values(cells), `${op.method} ${op.path} as ${actor}`).toEqual(
            (typeof cells === 'number' ? [cells] : Object.values(cells)).map(() => 403),
          );
        }
      }
    }
  });

  for (const [route, row] of Object.entries(table)) {
    it(route, async () => {
      expect(await actualCells(route, row)).toEqual(row.expected);
    }, 60_000);
  }
});

describe('what each role sees', () => {
  it('lists only what the caller may see', async () => {
    const w = (world = await buildWorld());
    world = null;
    const designNames = async (actor: Exclude<Actor, 'anonymous'>) =>
      ((await request(app).get('/api/designs').set(w.auth[actor]!)).body.items as { name: string }[]).map((d) => d.name).sort();
    expect(await designNames('admin')).toEqual(['Admin line sensor', 'Dana line sensor', 'Otto private sensor', 'Otto shared sensor']);
    expect(await designNames('designer')).toEqual(['Dana line sensor']);
    expect(await designNames('reviewer')).toEqual([]);
    const totalOf = async (actor: Exclude<Actor, 'anonymous'>, page: number) => (await request(app).get(`/api/designs?pageSize=2&page=${page}`).set(w.auth[actor]!)).body;
    expect(await totalOf('admin', 1)).toMatchObject({ total: 4, items: [{}, {}] });
    expect(await totalOf('admin', 5)).toMatchObject({ total: 4, items: [] });
    expect(await totalOf('designer', 0)).toMatchObject({ total: 1, items: [{ name: 'Dana line sensor' }] });
    expect(await totalOf('designer', 3)).toMatchObject({ total: 1, items: [] });
    expect(await totalOf('reviewer', 0)).toMatchObject({ total: 0, items: [] });

    const reviewIds = async (actor: Exclude<Actor, 'anonymous'>) => ((await request(app).get('/api/reviews').set(w.auth[actor]!)).body.items as { id: string }[]).map((r) => r.id);
    expect(await reviewIds('admin')).toEqual([w.reviews.shared.admin.reviewId]);
    expect(await reviewIds('designer')).toEqual([w.reviews.shared.designer.reviewId]);
    expect(await reviewIds('reviewer')).toEqual([w.reviews.shared.reviewer.reviewId]);

    const ofOwnDesign = await request(app).get(`/api/designs/${w.designs.designer}/reviews`).set(w.auth.designer!);
    expect(ofOwnDesign.body.items.map((r: { id: string }) => r.id)).toEqual([w.reviews.own.designer.reviewId]);
  });

  it('answers for someone else’s design exactly as for a design that does not exist', async () => {
    const w = (world = await buildWorld());
    world = null;
    const missing = '00000000-0000-4000-8000-000000000000';
    for (const path of ['/api/designs/{id}', '/api/designs/{id}/versions', '/api/designs/{id}/versions/1', '/api/designs/{id}/datasets', '/api/designs/{id}/versions/1/report']) {
      for (const actor of ['designer', 'reviewer'] as const) {
        const theirs = await request(app).get(path.replace('{id}', w.designs.others)).set(w.auth[actor]!);
        const none = await request(app).get(path.replace('{id}', missing)).set(w.auth[actor]!);
        expect(theirs.status, `${path} as ${actor}`).toBe(404);
        expect(theirs.body, `${path} as ${actor}`).toEqual(none.body);
      }
    }
    const theirReview = await request(app).get(`/api/reviews/${w.reviews.others.reviewId}`).set(w.auth.reviewer!);
    const noReview = await request(app).get(`/api/reviews/${missing}`).set(w.auth.reviewer!);
    expect(theirReview.status).toBe(404);
    expect(theirReview.body).toEqual(noReview.body);
  });
});

// Complements test/integration/auth.test.ts (tampered signature, expiry of the token, sign-out,
// a disabled flag set in the database, password change with Bearer tokens).
describe('sessions', () => {
  const me = (auth: Record<string, string>) => request(app).get('/api/auth/me').set(auth);
  const bearer = (token: string) => ({ Authorization: `Bearer ${token}` });
  const claimsOf = (token: string) => jwt.decode(token) as { sub: string; sid: string; iss: string; exp: number };

  it('rejects a token whose claims were altered, one signed with another key, one without a signature', async () => {
    await resetTables(testApp);
    const [dana, otto] = await Promise.all([createAccount(testApp, 'designer'), createAccount(testApp, 'admin')]);
    const { token } = await signIn(testApp, dana.email);
    const [header, payload, signature] = token.split('.') as [string, string, string];
    const claims = JSON.parse(Buffer.from(payload, 'base64url').toString('utf8')) as Record<string, unknown>;
    const otherPayload = Buffer.from(JSON.stringify({ ...claims, sub: otto.id })).toString('base64url');
    expect((await me(bearer(`${header}.${otherPayload}.${signature}`))).status).toBe(401);

    const foreignKey = jwt.sign({ sid: claims['sid'] }, 'another-secret-that-is-long-enough-0123456789', { algorithm: 'HS256', subject: dana.id, issuer: 'quietbridge', expiresIn: 600 });
    expect((await me(bearer(foreignKey))).status).toBe(401);
    const unsigned = `${Buffer.from(JSON.stringify({ alg: 'none', typ: 'JWT' })).toString('base64url')}.${payload}.`;
    expect((await me(bearer(unsigned))).status).toBe(401);
    const tamperedCookie = await request(app).get('/api/auth/me').set('Cookie', `qb_session=${header}.${otherPayload}.${signature}`);
    expect(tamperedCookie.status).toBe(401);
    expect((await me(bearer(token))).status).toBe(200);
  });

  it('binds a token to its session and account: a valid signature over another account’s session is refused', async () => {
    await resetTables(testApp);
    const [dana, otto] = await Promise.all([createAccount(testApp, 'designer'), createAccount(testApp, 'admin')]);
    const { token } = await signIn(testApp, dana.email);
    const forged = jwt.sign({ sid: claimsOf(token).sid }, testApp.config.sessionSecret, { algorithm: 'HS256', subject: otto.id, issuer: 'quietbridge', expiresIn: 600 });
    expect((await me(bearer(forged))).status).toBe(401);
    const unknownSession = jwt.sign({ sid: '00000000-0000-4000-8000-000000000000' }, testApp.config.sessionSecret, { algorithm: 'HS256', subject: dana.id, issuer: 'quietbridge', expiresIn: 600 });
    expect((await me(bearer(unknownSession))).status).toBe(401);
  });

  it('rejects a session that has expired in the database even while its token has not', async () => {
    await resetTables(testApp);
    const dana = await createAccount(testApp, 'designer');
    const { token, cookieHeader } = await signIn(testApp, dana.email);
    expect(claimsOf(token).exp * 1000).toBeGreaterThan(Date.now() + 3600_000);
    await testApp.db.updateTable('sessions').set({ expires_at: sql<Date>`now() - interval '1 second'` }).execute();
    expect((await me(bearer(token))).status).toBe(401);
    expect((await request(app).get('/api/auth/me').set('Cookie', cookieHeader)).status).toBe(401);
  });

  it('stops a disabled account’s sessions at once, by token and by cookie, and enabling it again does not revive them', async () => {
    await resetTables(testApp);
    const [admin, dana] = await Promise.all([createAccount(testApp, 'admin'), createAccount(testApp, 'designer')]);
    const adminAuth = bearer((await signIn(testApp, admin.email)).token);
    const byToken = await signIn(testApp, dana.email);
    const byCookie = await signIn(testApp, dana.email);
    expect((await request(app).get('/api/designs').set(bearer(byToken.token))).status).toBe(200);

    expect((await request(app).patch(`/api/users/${dana.id}`).set(adminAuth).send({ disabled: true })).status).toBe(200);
    expect((await request(app).get('/api/designs').set(bearer(byToken.token))).status).toBe(401);
    expect((await request(app).get('/api/designs').set('Cookie', byCookie.cookieHeader)).status).toBe(401);
    const save = await request(app).post('/api/designs').set('Cookie', byCookie.cookieHeader).set('X-CSRF-Token', byCookie.csrf).send({ name: 'Late', document: demoPressure });
    expect(save.status).toBe(401);

    expect((await request(app).patch(`/api/users/${dana.id}`).set(adminAuth).send({ disabled: false })).status).toBe(200);
    expect((await me(bearer(byToken.token))).status).toBe(401);
    expect((await request(app).get('/api/auth/me').set('Cookie', byCookie.cookieHeader)).status).toBe(401);
    expect((await signIn(testApp, dana.email)).token).toBeTruthy();
  });

  it('ends the sessions of an account whose role changes', async () => {
    await resetTables(testApp);
    const [admin, dana] = await Promise.all([createAccount(testApp, 'admin'), createAccount(testApp, 'designer')]);
    const adminAuth = bearer((await signIn(testApp, admin.email)).token);
    const { token } = await signIn(testApp, dana.email);
    expect((await request(app).patch(`/api/users/${dana.id}`).set(adminAuth).send({ role: 'reviewer' })).status).toBe(200);
    expect((await me(bearer(token))).status).toBe(401);
  });

  it('signs out one session only: the cookie of that session stops working, the account’s other sessions go on', async () => {
    await resetTables(testApp);
    const dana = await createAccount(testApp, 'designer');
    const browser = await signIn(testApp, dana.email);
    const script = await signIn(testApp, dana.email);
    const out = await request(app).post('/api/auth/sign-out').set('Cookie', browser.cookieHeader).set('X-CSRF-Token', browser.csrf);
    expect(out.status).toBe(204);
    expect((await request(app).get('/api/auth/me').set('Cookie', browser.cookieHeader)).status).toBe(401);
    expect((await me(bearer(browser.token))).status).toBe(401);
    expect((await request(app).post('/api/auth/sign-out').set('Cookie', browser.cookieHeader).set('X-CSRF-Token', browser.csrf)).status).toBe(401);
    expect((await me(bearer(script.token))).status).toBe(200);
  });

  it('ends the other sessions, cookies included, at a password change and keeps the one that changed it', async () => {
    await resetTables(testApp);
    const dana = await createAccount(testApp, 'designer');
    const browser = await signIn(testApp, dana.email);
    const otherBrowser = await signIn(testApp, dana.email);
    const changed = await request(app)
      .post('/api/auth/password')
      .set('Cookie', browser.cookieHeader)
      .set('X-CSRF-Token', browser.csrf)
      .send({ currentPassword: TEST_PASSWORD, newPassword: 'a-new-long-secret-17' });
    expect(changed.status).toBe(204);
    expect((await request(app).get('/api/auth/me').set('Cookie', browser.cookieHeader)).status).toBe(200);
    expect((await request(app).get('/api/auth/me').set('Cookie', otherBrowser.cookieHeader)).status).toBe(401);
    expect((await me(bearer(otherBrowser.token))).status).toBe(401);
    expect((await request(app).post('/api/auth/sign-in').send({ email: dana.email, password: TEST_PASSWORD })).status).toBe(401);
  });
});
