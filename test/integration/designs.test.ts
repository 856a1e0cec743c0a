import request from 'supertest';
import { afterAll, beforeEach, describe, expect, it } from 'vitest';
import demoPressure from '@shared/examples/demo-pressure.json';
import demoFlow from '@shared/examples/demo-flow.json';
import { evaluateBudget } from '@shared/engine/budget/evaluate';
import { loadDesign } from '@shared/contracts/design-loader';
import { createAccount, createTestApp, resetTables, signIn } from '../support/test-app';

const testApp = createTestApp();
const { app } = testApp;

afterAll(async () => {
  await testApp.db.destroy();
});

let designer: Record<string, string>;
let otherDesigner: Record<string, string>;
let reviewer: Record<string, string>;
let admin: Record<string, string>;

const bearer = (token: string) => ({ Authorization: `Bearer ${token}` });

beforeEach(async () => {
  await resetTables(testApp);
  const accounts = await Promise.all([
    createAccount(testApp, 'designer', 'dana@example.com'),
    createAccount(testApp, 'designer', 'otto@example.com'),
    createAccount(testApp, 'reviewer', 'rita@example.com'),
    createAccount(testApp, 'admin', 'ada@example.com'),
  ]);
  [designer, otherDesigner, reviewer, admin] = await Promise.all(accounts.map(async (a) => bearer((await signIn(testApp, a.email)).token)));
});

async function createDemo(auth = designer, document: unknown = demoPressure, name = 'Line sensor, pressure') {
  const response = await request(app).post('/api/designs').set(auth).send({ name, document });
  expect(response.status).toBe(201);
  return response.body as { id: string; latestVersion: number };
}

function amplitudeChanged(amplitude: number) {
  return { ...demoPressure, excitation: { ...demoPressure.excitation, amplitude } };
}

describe('designs and versions', () => {
  it('creates a design as version 1 with the key figures the shared engine computes', async () => {
    const response = await request(app).post('/api/designs').set(designer).send({ name: 'Line sensor, pressure', document: demoPressure });
    expect(response.status).toBe(201);
    expect(response.headers.location).toBe(`/api/designs/${response.body.id}`);
    expect(response.body).toMatchObject({ name: 'Line sensor, pressure', latestVersion: 1, archived: false, owner: { email: 'dana@example.com' } });
    const loaded = loadDesign(demoPressure);
    if (!loaded.ok) throw new Error('demo design must be valid');
    const budget = evaluateBudget(loaded.design);
    const figures = response.body.latest.figures;
    expect(figures.voltsPerFarad).toBeCloseTo(budget.sensitivity.voltsPerFarad!, 6);
    expect(figures.resolution.farad).toBeCloseTo(budget.resolution.farad!, 25);
    expect(figures.outputNoiseRms).toBeCloseTo(budget.noise.outputRms, 12);
    expect(figures.findings.error).toBe(0);
    expect(figures.worstHeadroom.node).toBe(budget.closestToClipping);

    const version = await request(app).get(`/api/designs/${response.body.id}/versions/1`).set(designer);
    expect(version.status).toBe(200);
    expect(version.body).toMatchObject({ number: 1, message: 'First version', formatVersion: 1, author: { email: 'dana@example.com' } });
    expect(version.body.document.excitation.amplitude).toBe(demoPressure.excitation.amplitude);
  });

  it('saves versions on top of the latest, numbered without gaps, each with its own figures', async () => {
    const { id } = await createDemo();
    const v2 = await request(app).post(`/api/designs/${id}/versions`).set(designer).send({ document: amplitudeChanged(1), message: 'Halve the excitation', baseVersion: 1 });
    expect(v2.status).toBe(201);
    expect(v2.body.number).toBe(2);
    const v3 = await request(app).post(`/api/designs/${id}/versions`).set(designer).send({ document: amplitudeChanged(2), message: 'Back to 2 V', baseVersion: 2 });
    expect(v3.body.number).toBe(3);
    // Scaling law (ENGINE.md section 4): sensitivity is proportional to the excitation amplitude.
    expect(v3.body.figures.voltsPerFarad / v2.body.figures.voltsPerFarad).toBeCloseTo(2, 6);
    const list = await request(app).get(`/api/designs/${id}/versions`).set(designer);
    expect(list.body.items.map((v: { number: number; message: string }) => [v.number, v.message])).toEqual([
      [3, 'Back to 2 V'],
      [2, 'Halve the excitation'],
      [1, 'First version'],
    ]);
    const design = await request(app).get(`/api/designs/${id}`).set(designer);
    expect(design.body.latestVersion).toBe(3);
  });

  it('answers 409 on a stale base version and overwrites nothing', async () => {
    const { id } = await createDemo();
    await request(app).post(`/api/designs/${id}/versions`).set(designer).send({ document: amplitudeChanged(1.5), message: 'From tab one', baseVersion: 1 });
    const stale = await request(app).post(`/api/designs/${id}/versions`).set(designer).send({ document: amplitudeChanged(1), message: 'From tab two', baseVersion: 1 });
    expect(stale.status).toBe(409);
    expect(stale.body).toMatchObject({ status: 409, title: 'Newer version exists', latestVersion: 2, errors: [{ path: 'baseVersion' }] });
    const v2 = await request(app).get(`/api/designs/${id}/versions/2`).set(designer);
    expect(v2.body.message).toBe('From tab one');
    expect(v2.body.document.excitation.amplitude).toBe(1.5);
    expect((await request(app).get(`/api/designs/${id}/versions/3`).set(designer)).status).toBe(404);
    const onTop = await request(app).post(`/api/designs/${id}/versions`).set(designer).send({ document: amplitudeChanged(1), message: 'From tab two', baseVersion: 2 });
    expect(onTop.status).toBe(201);
    expect(onTop.body.number).toBe(3);
  });

  it('answers 400 naming the document field for an invalid design, and stores nothing', async () => {
    const broken = { ...demoPressure, chain: demoPressure.chain.map((stage, index) => (index === 0 ? { ...stage, feedbackCapacitance: -1 } : stage)) };
    const response = await request(app).post('/api/designs').set(designer).send({ name: 'Broken', document: broken });
    expect(response.status).toBe(400);
    expect(response.body.errors.map((e: { path: string }) => e.path)).toContain('document.chain[0].feedbackCapacitance');
    const missing = await request(app).post('/api/designs').set(designer).send({ document: demoPressure });
    expect(missing.status).toBe(400);
    expect(missing.body.errors[0]).toEqual({ path: 'name', message: 'Name is required' });
    const notObject = await request(app).post('/api/designs').set(designer).send({ name: 'x', document: 'pressure sensor' });
    expect(notObject.status).toBe(400);
    expect((await request(app).get('/api/designs').set(designer)).body.total).toBe(0);

    const { id } = await createDemo();
    const badVersion = await request(app).post(`/api/designs/${id}/versions`).set(designer).send({ document: broken, message: '', baseVersion: 'one' });
    expect(badVersion.status).toBe(400);
    expect(badVersion.body.errors.map((e: { path: string }) => e.path).sort()).toEqual(['baseVersion', 'message']);
  });

  it("answers 404 for another designer's design and for a reviewer, on every route", async () => {
    const { id } = await createDemo();
    for (const auth of [otherDesigner, reviewer]) {
      expect((await request(app).get(`/api/designs/${id}`).set(auth)).status).toBe(404);
      expect((await request(app).get(`/api/designs/${id}/versions`).set(auth)).status).toBe(404);
      expect((await request(app).get(`/api/designs/${id}/versions/1`).set(auth)).status).toBe(404);
      expect((await request(app).patch(`/api/designs/${id}`).set(auth).send({ name: 'Mine now' })).status).toBe(404);
      const save = await request(app).post(`/api/designs/${id}/versions`).set(auth).send({ document: demoPressure, message: 'x', baseVersion: 1 });
      expect(save.status).toBe(404);
      expect((await request(app).get('/api/designs').set(auth)).body.total).toBe(0);
    }
    expect((await request(app).post('/api/designs').set(reviewer).send({ name: 'x', document: demoPressure })).status).toBe(403);
    expect((await request(app).get('/api/designs')).status).toBe(401);
    const adminView = await request(app).get(`/api/designs/${id}`).set(admin);
    expect(adminView.status).toBe(200);
    expect((await request(app).get('/api/designs/not-a-uuid').set(designer)).status).toBe(400);
  });

  it('renames and archives; archived designs leave the default list and refuse new versions until restored', async () => {
    const { id } = await createDemo();
    await createDemo(designer, demoFlow, 'Line sensor, flow');
    const renamed = await request(app).patch(`/api/designs/${id}`).set(designer).send({ name: 'Line sensor, pressure (rev B)' });
    expect(renamed.body.name).toBe('Line sensor, pressure (rev B)');
    const archived = await request(app).patch(`/api/designs/${id}`).set(designer).send({ archived: true });
    expect(archived.body.archived).toBe(true);
    const active = await request(app).get('/api/designs').set(designer);
    expect(active.body.items.map((d: { name: string }) => d.name)).toEqual(['Line sensor, flow']);
    const onlyArchived = await request(app).get('/api/designs?archived=true').set(designer);
    expect(onlyArchived.body.items.map((d: { id: string }) => d.id)).toEqual([id]);
    const save = await request(app).post(`/api/designs/${id}/versions`).set(designer).send({ document: demoPressure, message: 'x', baseVersion: 1 });
    expect(save.status).toBe(409);
    await request(app).patch(`/api/designs/${id}`).set(designer).send({ archived: false });
    expect((await request(app).post(`/api/designs/${id}/versions`).set(designer).send({ document: demoPressure, message: 'x', baseVersion: 1 })).status).toBe(201);
  });

  it('lists with sort, search and paging', async () => {
    for (const name of ['Beta', 'Alpha', 'Gamma']) await createDemo(designer, demoPressure, name);
    const byName = await request(app).get('/api/designs?sort=name&order=asc&pageSize=2').set(designer);
    expect(byName.body.total).toBe(3);
    expect(byName.body.items.map((d: { name: string }) => d.name)).toEqual(['Alpha', 'Beta']);
    const search = await request(app).get('/api/designs?q=amm').set(designer);
    expect(search.body.items.map((d: { name: string }) => d.name)).toEqual(['Gamma']);
    const bad = await request(app).get('/api/designs?sort=owner&archived=maybe').set(designer);
    expect(bad.status).toBe(400);
    expect(bad.body.errors.map((e: { path: string }) => e.path).sort()).toEqual(['archived', 'sort']);
  });

  it('saves each of 20 concurrent saves on one base exactly once: one winner, the rest 409', async () => {
    const { id } = await createDemo();
    const attempts = await Promise.all(
      Array.from({ length: 20 }, (_, i) =>
        request(app).post(`/api/designs/${id}/versions`).set(designer).send({ document: amplitudeChanged(1 + i / 100), message: `attempt ${i}`, baseVersion: 1 }),
      ),
    );
    const statuses = attempts.map((a) => a.status).sort();
    expect(statuses.filter((s) => s === 201)).toHaveLength(1);
    expect(statuses.filter((s) => s === 409)).toHaveLength(19);
    const versions = await request(app).get(`/api/designs/${id}/versions`).set(designer);
    expect(versions.body.items.map((v: { number: number }) => v.number)).toEqual([2, 1]);
  });
});
