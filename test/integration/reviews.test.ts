import { pino } from 'pino';
import request from 'supertest';
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import demoPressure from '@shared/examples/demo-pressure.json';
import { startMailCatcher, type MailCatcher } from '../../api/mail/catcher';
import { createOutbox, createSmtpTransport, type Outbox } from '../../api/mail/outbox';
import { createAccount, createTestApp, resetTables, signIn, TEST_PASSWORD, type TestApp } from '../support/test-app';

// A catcher on a free port, and an outbox that sends to it; the outbox is driven by the test
// (deliverDue) so that nothing depends on timing.
let catcher: MailCatcher | null;
let catcherPort: number;
let outbox: Outbox;
let testApp: TestApp;

beforeAll(async () => {
  testApp = createTestApp({ publicUrl: 'http://127.0.0.1:4999' });
  catcher = await startMailCatcher(testApp.db, 0);
  catcherPort = catcher.port;
  outbox = createOutbox({ db: testApp.db, transport: createSmtpTransport(`smtp://127.0.0.1:${catcherPort}`), from: 'Quietbridge <qb@localhost>', logger: pino({ level: 'silent' }) });
});

afterAll(async () => {
  await catcher?.close();
  await testApp.db.destroy();
});

const bearer = (token: string) => ({ Authorization: `Bearer ${token}` });
let designer: Record<string, string>;
let otherDesigner: Record<string, string>;
let reviewer: Record<string, string>;
let outsider: Record<string, string>;
let designId: string;

beforeEach(async () => {
  await resetTables(testApp);
  await createAccount(testApp, 'designer', 'dana@example.com');
  await createAccount(testApp, 'designer', 'otto@example.com');
  await createAccount(testApp, 'reviewer', 'rita@example.com');
  await createAccount(testApp, 'reviewer', 'rolf@example.com');
  designer = bearer((await signIn(testApp, 'dana@example.com')).token);
  otherDesigner = bearer((await signIn(testApp, 'otto@example.com')).token);
  reviewer = bearer((await signIn(testApp, 'rita@example.com')).token);
  outsider = bearer((await signIn(testApp, 'rolf@example.com')).token);
  const created = await request(testApp.app).post('/api/designs').set(designer).send({ name: 'Line sensor', document: demoPressure });
  designId = created.body.id;
});

async function caughtMail(to: string) {
  const rows = await testApp.db.selectFrom('mailbox_messages').selectAll().where((eb) => eb(eb.val(to), '=', eb.fn.any('recipients'))).orderBy('received_at').execute();
  return rows;
}

function linkIn(text: string): string {
  const match = /(http:\/\/127\.0\.0\.1:4999\/\S+)/.exec(text);
  if (!match) throw new Error(`no link in: ${text}`);
  return match[1]!;
}

describe('the review loop', () => {
  it('reports each design\'s latest review in the designs list: none, then pending, then the decision', async () => {
    const latestReview = async () => (await request(testApp.app).get('/api/designs').set(designer)).body.items.find((item: { id: string }) => item.id === designId).latestReview;
    expect(await latestReview()).toBeNull();
    const share = await request(testApp.app).post(`/api/designs/${designId}/versions/1/reviews`).set(designer).send({ reviewerEmail: 'rita@example.com' });
    expect(share.status).toBe(201);
    expect(await latestReview()).toEqual({ state: 'pending', versionNumber: 1 });
    expect((await request(testApp.app).post(`/api/reviews/${share.body.id}/decision`).set(reviewer).send({ decision: 'changes_requested', note: 'Corner too low' })).status).toBe(200);
    expect(await latestReview()).toEqual({ state: 'changes_requested', versionNumber: 1 });
    expect((await request(testApp.app).get(`/api/designs/${designId}`).set(designer)).body.latestReview).toEqual({ state: 'changes_requested', versionNumber: 1 });
  });

  it('shares with an existing reviewer, who comments, replies are threaded, and a decision mails the designer', async () => {
    const share = await request(testApp.app).post(`/api/designs/${designId}/versions/1/reviews`).set(designer).send({ reviewerEmail: 'Rita@Example.com', note: 'Please check the ripple' });
    expect(share.status).toBe(201);
    expect(share.body).toMatchObject({ state: 'pending', versionNumber: 1, reviewer: { email: 'rita@example.com' }, notification: 'pending' });
    expect(await outbox.deliverDue()).toBe(1);
    const [requestMail] = await caughtMail('rita@example.com');
    expect(requestMail!.subject).toBe('Review requested: Line sensor, version 1');
    expect(requestMail!.text_body).toContain('Please check the ripple');
    expect(requestMail!.html_body).toContain('<a href="http://127.0.0.1:4999/reviews/');
    expect(linkIn(requestMail!.text_body)).toBe(`http://127.0.0.1:4999/reviews/${share.body.id}`);

    const reviewId = share.body.id as string;
    const mine = await request(testApp.app).get('/api/reviews').set(reviewer);
    expect(mine.body.items.map((r: { id: string; notification: string }) => [r.id, r.notification])).toEqual([[reviewId, 'sent']]);
    const detail = await request(testApp.app).get(`/api/reviews/${reviewId}`).set(reviewer);
    expect(detail.status).toBe(200);
    expect(detail.body.version.document.excitation.amplitude).toBe(2);
    expect(detail.body.version.figures.voltsPerFarad).toBeGreaterThan(0);

    const comment = await request(testApp.app).post(`/api/reviews/${reviewId}/comments`).set(reviewer).send({ body: 'Corner too close to the ripple?', stage: 'lp', field: 'corner' });
    expect(comment.status).toBe(201);
    expect(comment.body).toMatchObject({ stage: 'lp', field: 'corner', parentId: null, resolved: false, author: { email: 'rita@example.com' } });
    const reply = await request(testApp.app).post(`/api/reviews/${reviewId}/comments`).set(designer).send({ body: 'Raised the order in v2', parentId: comment.body.id });
    expect(reply.body.parentId).toBe(comment.body.id);
    const resolved = await request(testApp.app).patch(`/api/reviews/${reviewId}/comments/${comment.body.id}`).set(designer).send({ resolved: true });
    expect(resolved.body.resolved).toBe(true);
    const fieldWithoutStage = await request(testApp.app).post(`/api/reviews/${reviewId}/comments`).set(reviewer).send({ body: 'x', field: 'corner' });
    expect(fieldWithoutStage.status).toBe(400);
    expect(fieldWithoutStage.body.errors[0].path).toBe('stage');

    expect((await request(testApp.app).post(`/api/reviews/${reviewId}/decision`).set(designer).send({ decision: 'approved' })).status).toBe(403);
    const decision = await request(testApp.app).post(`/api/reviews/${reviewId}/decision`).set(reviewer).send({ decision: 'changes_requested', note: 'Ripple above one LSB' });
    expect(decision.status).toBe(200);
    expect(decision.body).toMatchObject({ state: 'changes_requested', decisionNote: 'Ripple above one LSB' });
    const again = await request(testApp.app).post(`/api/reviews/${reviewId}/decision`).set(reviewer).send({ decision: 'approved' });
    expect(again.status).toBe(409);
    await outbox.deliverDue();
    const [decisionMessage] = await caughtMail('dana@example.com');
    expect(decisionMessage!.subject).toBe('Changes requested: Line sensor, version 1');

    const designReviews = await request(testApp.app).get(`/api/designs/${designId}/reviews`).set(designer);
    expect(designReviews.body.items[0].state).toBe('changes_requested');
    const audit = await request(testApp.app).get(`/api/designs/${designId}/audit`).set(designer);
    expect(audit.body.items.map((e: { action: string }) => e.action)).toEqual(['created', 'shared', 'commented', 'commented', 'decided']);
    expect(audit.body.items[4]).toMatchObject({ actor: { email: 'rita@example.com' }, versionNumber: 1, detail: { decision: 'changes_requested' } });
  });

  it('shows a reviewer nothing that was not shared with them: 404, not 403', async () => {
    const share = await request(testApp.app).post(`/api/designs/${designId}/versions/1/reviews`).set(designer).send({ reviewerEmail: 'rita@example.com' });
    const reviewId = share.body.id as string;
    for (const auth of [outsider, otherDesigner]) {
      expect((await request(testApp.app).get(`/api/reviews/${reviewId}`).set(auth)).status).toBe(404);
      expect((await request(testApp.app).post(`/api/reviews/${reviewId}/comments`).set(auth).send({ body: 'x' })).status).toBe(404);
      expect((await request(testApp.app).post(`/api/reviews/${reviewId}/decision`).set(auth).send({ decision: 'approved' })).status).toBe(404);
      expect((await request(testApp.app).get('/api/reviews').set(auth)).body.items).toEqual([]);
    }
    expect((await request(testApp.app).get(`/api/designs/${designId}`).set(reviewer)).status).toBe(404);
    expect((await request(testApp.app).get(`/api/designs/${designId}/reviews`).set(reviewer)).status).toBe(404);
    expect((await request(testApp.app).post(`/api/designs/${designId}/versions/1/reviews`).set(otherDesigner).send({ reviewerEmail: 'rita@example.com' })).status).toBe(404);
    expect((await request(testApp.app).post(`/api/designs/${designId}/versions/1/reviews`).set(reviewer).send({ reviewerEmail: 'rolf@example.com' })).status).toBe(403);
    expect((await request(testApp.app).get(`/api/designs/${designId}/audit`).set(reviewer)).status).toBe(403);
    expect((await request(testApp.app).get(`/api/reviews/00000000-0000-4000-8000-000000000000`).set(reviewer)).status).toBe(404);
  });

  it('checks the share body: owner as reviewer, bad address, missing version', async () => {
    const self = await request(testApp.app).post(`/api/designs/${designId}/versions/1/reviews`).set(designer).send({ reviewerEmail: 'dana@example.com' });
    expect(self.status).toBe(400);
    expect(self.body.errors[0].path).toBe('reviewerEmail');
    const bad = await request(testApp.app).post(`/api/designs/${designId}/versions/1/reviews`).set(designer).send({ reviewerEmail: 'nobody' });
    expect(bad.status).toBe(400);
    expect((await request(testApp.app).post(`/api/designs/${designId}/versions/9/reviews`).set(designer).send({ reviewerEmail: 'rita@example.com' })).status).toBe(404);
    const designerAsReviewer = await request(testApp.app).post(`/api/designs/${designId}/versions/1/reviews`).set(designer).send({ reviewerEmail: 'otto@example.com' });
    expect(designerAsReviewer.status).toBe(201);
    expect((await request(testApp.app).get(`/api/reviews/${designerAsReviewer.body.id}`).set(otherDesigner)).status).toBe(200);
  });

  it('invites an unknown address: a one-time sign-up link creates a reviewer account that sees the review', async () => {
    const share = await request(testApp.app).post(`/api/designs/${designId}/versions/1/reviews`).set(designer).send({ reviewerEmail: 'newcomer@example.com' });
    expect(share.status).toBe(201);
    expect(share.body.reviewer).toBeNull();
    await outbox.deliverDue();
    const [invitation] = await caughtMail('newcomer@example.com');
    expect(invitation!.subject).toBe('Invitation to review: Line sensor, version 1');
    const link = new URL(linkIn(invitation!.text_body));
    expect(link.pathname).toBe('/sign-up');
    const token = link.searchParams.get('token')!;

    const info = await request(testApp.app).get(`/api/invitations/${token}`);
    expect(info.status).toBe(200);
    expect(info.body.email).toBe('newcomer@example.com');
    const weak = await request(testApp.app).post(`/api/invitations/${token}/accept`).send({ displayName: 'New Reviewer', password: 'password123' });
    expect(weak.status).toBe(400);
    const accepted = await request(testApp.app).post(`/api/invitations/${token}/accept`).send({ displayName: 'New Reviewer', password: TEST_PASSWORD });
    expect(accepted.status).toBe(201);
    expect(accepted.body.user).toMatchObject({ email: 'newcomer@example.com', role: 'reviewer' });
    const theirs = await request(testApp.app).get('/api/reviews').set(bearer(accepted.body.token));
    expect(theirs.body.items.map((r: { id: string }) => r.id)).toEqual([share.body.id]);

    const reuse = await request(testApp.app).post(`/api/invitations/${token}/accept`).send({ displayName: 'Someone Else', password: 'another-fine-password' });
    expect(reuse.status).toBe(410);
    expect(reuse.body.title).toBe('Invitation used');
    expect((await request(testApp.app).get(`/api/invitations/${token}`)).status).toBe(410);
    expect((await request(testApp.app).get(`/api/invitations/${'x'.repeat(43)}`)).status).toBe(404);
  });

  it('rejects an expired invitation link', async () => {
    await request(testApp.app).post(`/api/designs/${designId}/versions/1/reviews`).set(designer).send({ reviewerEmail: 'late@example.com' });
    await outbox.deliverDue();
    const [invitation] = await caughtMail('late@example.com');
    const token = new URL(linkIn(invitation!.text_body)).searchParams.get('token')!;
    await testApp.db.updateTable('invitations').set({ expires_at: new Date(Date.now() - 1000) }).execute();
    const expired = await request(testApp.app).post(`/api/invitations/${token}/accept`).send({ displayName: 'Late', password: TEST_PASSWORD });
    expect(expired.status).toBe(410);
    expect(expired.body.title).toBe('Invitation expired');
  });

  it('keeps mail in the outbox while the mail server is down and sends it once it is back', async () => {
    await catcher!.close();
    catcher = null;
    const share = await request(testApp.app).post(`/api/designs/${designId}/versions/1/reviews`).set(designer).send({ reviewerEmail: 'rita@example.com' });
    expect(share.status).toBe(201);
    expect(await outbox.deliverDue()).toBe(0);
    const pending = await testApp.db.selectFrom('outbox').selectAll().execute();
    expect(pending).toHaveLength(1);
    expect(pending[0]!.sent_at).toBeNull();
    expect(pending[0]!.attempts).toBe(1);
    expect(pending[0]!.last_error).toBeTruthy();
    expect((await request(testApp.app).get(`/api/reviews/${share.body.id}`).set(reviewer)).body.review.notification).toBe('pending');

    catcher = await startMailCatcher(testApp.db, catcherPort);
    await testApp.db.updateTable('outbox').set({ next_attempt_at: new Date() }).execute();
    expect(await outbox.deliverDue()).toBe(1);
    expect(await caughtMail('rita@example.com')).toHaveLength(1);
    expect((await request(testApp.app).get(`/api/reviews/${share.body.id}`).set(reviewer)).body.review.notification).toBe('sent');
  });

  it('lists caught mail for admins only', async () => {
    await createAccount(testApp, 'admin', 'ada@example.com');
    const admin = bearer((await signIn(testApp, 'ada@example.com')).token);
    await request(testApp.app).post(`/api/designs/${designId}/versions/1/reviews`).set(designer).send({ reviewerEmail: 'rita@example.com' });
    await outbox.deliverDue();
    const list = await request(testApp.app).get('/api/mailbox').set(admin);
    expect(list.status).toBe(200);
    expect(list.body.items[0]).toMatchObject({ to: ['rita@example.com'], subject: 'Review requested: Line sensor, version 1' });
    expect(list.body.items[0].html).toContain('<a href=');
    const one = await request(testApp.app).get(`/api/mailbox/${list.body.items[0].id}`).set(admin);
    expect(one.body.text).toContain('/reviews/');
    expect((await request(testApp.app).get('/api/mailbox').set(designer)).status).toBe(403);
  });

  it('refuses to change or delete audit events', async () => {
    await expect(testApp.db.updateTable('audit_events').set({ action: 'saved' }).execute()).rejects.toThrow(/append-only/);
    await expect(testApp.db.deleteFrom('audit_events').execute()).rejects.toThrow(/append-only/);
  });
});

describe('the design report', () => {
  it('is a PDF of several pages for the owner and the version’s reviewer, and 404 for anyone else', async () => {
    const share = await request(testApp.app).post(`/api/designs/${designId}/versions/1/reviews`).set(designer).send({ reviewerEmail: 'rita@example.com' });
    await request(testApp.app).post(`/api/reviews/${share.body.id}/decision`).set(reviewer).send({ decision: 'approved', note: 'Fine' });
    const pdf = await request(testApp.app)
      .get(`/api/designs/${designId}/versions/1/report`)
      .set(designer)
      .buffer(true)
      .parse((res, callback) => {
        const chunks: Buffer[] = [];
        res.on('data', (chunk: Buffer) => chunks.push(chunk));
        res.on('end', () => callback(null, Buffer.concat(chunks)));
      });
    expect(pdf.status).toBe(200);
    expect(pdf.headers['content-type']).toBe('application/pdf');
    expect(pdf.headers['content-disposition']).toBe('attachment; filename="Line-sensor-v1-report.pdf"');
    const body = pdf.body as Buffer;
    expect(body.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    const pages = body.toString('latin1').match(/\/Type \/Page\b/g) ?? [];
    expect(pages.length).toBeGreaterThanOrEqual(2);

    expect((await request(testApp.app).get(`/api/designs/${designId}/versions/1/report`).set(reviewer)).status).toBe(200);
    expect((await request(testApp.app).get(`/api/designs/${designId}/versions/1/report`).set(outsider)).status).toBe(404);
    expect((await request(testApp.app).get(`/api/designs/${designId}/versions/1/report`).set(otherDesigner)).status).toBe(404);
    expect((await request(testApp.app).get(`/api/designs/${designId}/versions/7/report`).set(designer)).status).toBe(404);
  }, 60_000);
});
