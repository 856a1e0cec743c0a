import { readFileSync } from 'node:fs';
import { sql } from 'kysely';
import request from 'supertest';
import { afterAll, beforeEach, describe, expect, it } from 'vitest';
import demoPressure from '@shared/examples/demo-pressure.json';
import { MAX_DATASET_BYTES } from '@shared/contracts/calibration';
import { analyseCell } from '@shared/engine/calibration/cell-analysis';
import { DEFAULT_DEMO_PASSWORD, seedDemoAccounts } from '../../tools/seed/demo-accounts';
import { DEMO_BATCH_NAME, demoBatchCsv, seedDemoCalibration } from '../../tools/seed/demo-calibration';
import { seedDemoDesigns } from '../../tools/seed/demo-designs';
import { createAccount, createTestApp, resetTables, signIn } from '../support/test-app';

const testApp = createTestApp();
const { app, db } = testApp;

afterAll(async () => {
  await testApp.db.destroy();
});

const bearer = (token: string) => ({ Authorization: `Bearer ${token}` });
let designer: Record<string, string>;
let otherDesigner: Record<string, string>;
let reviewer: Record<string, string>;
let admin: Record<string, string>;
let designId: string;

const mapping = {
  referenceColumn: 'pressure',
  referenceUnit: 'kPa',
  readoutColumn: 'output',
  readoutUnit: 'mV',
  cellColumn: 'cell',
  runColumn: 'run',
  directionColumn: 'dir',
  timeColumn: 't',
};

/** Two cells, one run each way, three set points. */
const goodCsv = [
  'cell,run,dir,pressure,output,t',
  'A,1,up,0,1.5,0',
  'A,1,up,30,151.0,10',
  'A,1,up,60,300.5,20',
  'A,1,down,60,300.9,30',
  'A,1,down,30,151.8,40',
  'A,1,down,0,1.9,50',
  'B,1,up,0,-2.0,0',
  'B,1,up,30,148.2,10',
  'B,1,up,60,297.0,20',
  'B,1,down,60,297.4,30',
  'B,1,down,30,149.0,40',
  'B,1,down,0,-1.6,50',
].join('\n');

function upload(auth: Record<string, string>, content: Buffer | string, fields: Record<string, string> = mapping, path = `/api/designs/${designId}/datasets`, fileName = 'bench.csv') {
  let call = request(app).post(path).set(auth);
  for (const [name, value] of Object.entries(fields)) call = call.field(name, value);
  return call.attach('file', Buffer.isBuffer(content) ? content : Buffer.from(content), { filename: fileName, contentType: 'text/csv' });
}

async function storedCount(): Promise<{ datasets: number; points: number }> {
  const { rows } = await sql<{ datasets: string; points: string }>`select (select count(*) from calibration_datasets) as datasets, (select count(*) from calibration_points) as points`.execute(db);
  return { datasets: Number(rows[0].datasets), points: Number(rows[0].points) };
}

beforeEach(async () => {
  await resetTables(testApp);
  const accounts = await Promise.all([
    createAccount(testApp, 'designer', 'dana@example.com'),
    createAccount(testApp, 'designer', 'otto@example.com'),
    createAccount(testApp, 'reviewer', 'rita@example.com'),
    createAccount(testApp, 'admin', 'ada@example.com'),
  ]);
  [designer, otherDesigner, reviewer, admin] = await Promise.all(accounts.map(async (a) => bearer((await signIn(testApp, a.email)).token)));
  const created = await request(app).post('/api/designs').set(designer).send({ name: 'Line sensor, pressure', document: demoPressure });
  designId = created.body.id;
});

describe('bench dataset upload', () => {
  it('stores the original file and its points in SI units, lists and returns them, and deletes them', async () => {
    const response = await upload(designer, goodCsv, { ...mapping, name: 'Bench, two cells', notes: 'first bench day' });
    expect(response.status).toBe(201);
    expect(response.headers.location).toBe(`/api/designs/${designId}/datasets/${response.body.id}`);
    expect(response.body).toMatchObject({
      name: 'Bench, two cells',
      notes: 'first bench day',
      fileName: 'bench.csv',
      fileSize: Buffer.byteLength(goodCsv),
      pointCount: 12,
      cells: ['A', 'B'],
      runs: ['1'],
      units: { reference: 'Pa', referenceDisplay: 'kPa', readout: 'V', readoutDisplay: 'mV' },
      referenceRange: { min: 0, max: 60000 },
      createdBy: { displayName: 'Test designer' },
    });

    const list = await request(app).get(`/api/designs/${designId}/datasets`).set(designer);
    expect(list.status).toBe(200);
    expect(list.body.items.map((item: { id: string }) => item.id)).toEqual([response.body.id]);

    const dataset = await request(app).get(`/api/designs/${designId}/datasets/${response.body.id}`).set(designer);
    expect(dataset.status).toBe(200);
    expect(dataset.body.points).toHaveLength(12);
    expect(dataset.body.points[1]).toEqual({ reference: 30000, readout: expect.closeTo(0.151, 15), cell: 'A', run: '1', direction: 'up', time: 10, row: 3 });

    const file = await request(app).get(`/api/designs/${designId}/datasets/${response.body.id}/file`).set(designer).buffer(true).parse((res, done) => {
      let text = '';
      res.on('data', (chunk: Buffer) => (text += chunk.toString('utf8')));
      res.on('end', () => done(null, text));
    });
    expect(file.status).toBe(200);
    expect(file.headers['content-disposition']).toContain('bench.csv');
    expect(file.body).toBe(goodCsv);

    const removed = await request(app).delete(`/api/designs/${designId}/datasets/${response.body.id}`).set(designer);
    expect(removed.status).toBe(204);
    expect(await storedCount()).toEqual({ datasets: 0, points: 0 });
    expect((await request(app).get(`/api/designs/${designId}/datasets/${response.body.id}`).set(designer)).status).toBe(404);
  });

  it('reads semicolon files with decimal commas and the short directions u and d', async () => {
    const csv = 'cell;run;dir;pressure;output;t\nA;1;u;0;1,5;0\nA;1;d;60;300,5;1\n';
    const response = await upload(designer, csv);
    expect(response.status).toBe(201);
    const dataset = await request(app).get(`/api/designs/${designId}/datasets/${response.body.id}`).set(designer);
    expect(dataset.body.points.map((point: { readout: number; direction: string }) => [point.readout, point.direction])).toEqual([
      [expect.closeTo(0.0015, 15), 'up'],
      [expect.closeTo(0.3005, 15), 'down'],
    ]);
  });

  it('previews the first rows and the row-level errors without storing anything', async () => {
    const bad = goodCsv.replace('A,1,up,30,151.0,10', 'A,1,up,30,abc,10').replace('B,1,down,0,-1.6,50', 'B,1,sideways,0,-1.6,50');
    const response = await upload(designer, bad, mapping, `/api/designs/${designId}/datasets/preview`);
    expect(response.status).toBe(200);
    expect(response.body).toMatchObject({ fileName: 'bench.csv', columns: ['cell', 'run', 'dir', 'pressure', 'output', 't'], delimiter: ',', rowCount: 12, complete: true, errorCount: 2 });
    expect(response.body.rows[0]).toEqual({ cell: 'A', run: '1', dir: 'up', pressure: '0', output: '1.5', t: '0' });
    expect(response.body.errors).toEqual([
      { path: 'file.rows[3].readout', message: 'row 3: readout is not a number ("abc" in column "output")' },
      { path: 'file.rows[13].direction', message: 'row 13: direction must be up or down ("sideways" in column "dir")' },
    ]);
    expect(response.body.points).toHaveLength(10);

    const columnsOnly = await upload(designer, goodCsv, {}, `/api/designs/${designId}/datasets/preview`);
    expect(columnsOnly.status).toBe(200);
    expect(columnsOnly.body).toMatchObject({ complete: false, errorCount: 0, points: [] });
    expect(await storedCount()).toEqual({ datasets: 0, points: 0 });
  });
});

describe('bench dataset upload: bad input, each with its message and nothing stored', () => {
  async function rejected(response: request.Response, status: number, path: string, detail: RegExp) {
    expect(response.status).toBe(status);
    expect(response.body).toMatchObject({ status, errors: expect.arrayContaining([expect.objectContaining({ path })]) });
    expect(response.body.detail).toMatch(detail);
    expect(await storedCount()).toEqual({ datasets: 0, points: 0 });
  }

  it('names a mapped column the file does not have', async () => {
    await rejected(await upload(designer, goodCsv, { ...mapping, readoutColumn: 'voltage' }), 400, 'readoutColumn', /Column "voltage" is not in the file \(columns: cell, run, dir, pressure, output, t\)/);
  });

  it('names the row and column of text in a number', async () => {
    const response = await upload(designer, goodCsv.replace('B,1,up,30,148.2,10', 'B,1,up,30,1O8.2,10'));
    await rejected(response, 400, 'file.rows[9].readout', /1 row could not be read, so nothing was stored; the first: row 9: readout is not a number \("1O8\.2" in column "output"\)/);
  });

  it('refuses an empty file', async () => {
    await rejected(await upload(designer, ''), 400, 'file', /The file is empty/);
  });

  it('refuses a header without rows', async () => {
    await rejected(await upload(designer, 'cell,run,dir,pressure,output,t\n'), 400, 'file', /header row but no data rows/);
  });

  it('refuses a file over the size limit with a 413 that says the limit', async () => {
    const big = Buffer.alloc(MAX_DATASET_BYTES + 1, 'A,1,up,0,1.5,0\n');
    await rejected(await upload(designer, big), 413, 'file', /larger than 2 MB; split the runs/);
  });

  it('refuses a binary file', async () => {
    const png = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0x00, 0x00, 0x00, 0x0d, 0x49, 0x48, 0x44, 0x52]);
    await rejected(await upload(designer, png, mapping, undefined, 'plot.png'), 400, 'file', /binary data \(a zero byte at offset 8\)/);
  });

  it('refuses text that is not UTF-8', async () => {
    await rejected(await upload(designer, Buffer.from('cell,run\nZelle \xe4,1\n', 'latin1')), 400, 'file', /not UTF-8 text/);
  });

  it('asks for the file and for a valid unit', async () => {
    const noFile = await request(app).post(`/api/designs/${designId}/datasets`).set(designer).field('referenceColumn', 'pressure');
    await rejected(noFile, 400, 'file', /multipart form field "file"/);
    await rejected(await upload(designer, goodCsv, { ...mapping, referenceUnit: 'furlong' }), 400, 'referenceUnit', /Reference unit must be one of Pa, kPa/);
    await rejected(await upload(designer, goodCsv, { ...mapping, directionColumn: '' }), 400, 'directionColumn', /Choose the direction column/);
  });
});

describe('bench dataset access', () => {
  it('hides datasets from another designer and from reviewers (404), shows them to admins', async () => {
    const created = await upload(designer, goodCsv);
    const id = created.body.id;
    for (const auth of [otherDesigner, reviewer]) {
      expect((await request(app).get(`/api/designs/${designId}/datasets`).set(auth)).status).toBe(404);
      expect((await request(app).get(`/api/designs/${designId}/datasets/${id}`).set(auth)).status).toBe(404);
      expect((await request(app).delete(`/api/designs/${designId}/datasets/${id}`).set(auth)).status).toBe(404);
      expect((await upload(auth, goodCsv)).status).toBe(404);
    }
    const seen = await request(app).get(`/api/designs/${designId}/datasets/${id}`).set(admin);
    expect(seen.status).toBe(200);
    expect(seen.body.points).toHaveLength(12);
    expect(await storedCount()).toEqual({ datasets: 1, points: 12 });
  });

  it('answers 404 for a dataset of another design and 400 for an id that is not a UUID', async () => {
    const created = await upload(designer, goodCsv);
    const other = await request(app).post('/api/designs').set(designer).send({ name: 'Second', document: demoPressure });
    expect((await request(app).get(`/api/designs/${other.body.id}/datasets/${created.body.id}`).set(designer)).status).toBe(404);
    const badId = await request(app).get(`/api/designs/${designId}/datasets/not-a-uuid`).set(designer);
    expect(badId.status).toBe(400);
    expect(badId.body.errors).toEqual([{ path: 'datasetId', message: 'Dataset id must be a UUID' }]);
  });

  it('refuses new bench data on an archived design', async () => {
    await request(app).patch(`/api/designs/${designId}`).set(designer).send({ archived: true });
    const response = await upload(designer, goodCsv);
    expect(response.status).toBe(409);
    expect(await storedCount()).toEqual({ datasets: 0, points: 0 });
  });
});

describe('demo calibration batch', () => {
  it('is the committed fixture, generated by the same code', () => {
    expect(readFileSync('test/fixtures/calibration/demo-batch.csv', 'utf8')).toBe(demoBatchCsv());
  });

  it('seeds six generated cells with up and down runs on the demo pressure design, once', async () => {
    await resetTables(testApp);
    await seedDemoAccounts(db, DEFAULT_DEMO_PASSWORD, 10);
    await seedDemoDesigns(db, 'test');
    expect(await seedDemoCalibration(db)).toEqual([DEMO_BATCH_NAME]);
    expect(await seedDemoCalibration(db)).toEqual([]);
    const { token } = await signIn(testApp, 'designer@example.com', DEFAULT_DEMO_PASSWORD);
    const designs = await request(app).get('/api/designs').set(bearer(token));
    const pressure = designs.body.items.find((item: { name: string }) => item.name === 'Dispensing robot line sensor, pressure');
    const list = await request(app).get(`/api/designs/${pressure.id}/datasets`).set(bearer(token));
    expect(list.body.items).toHaveLength(1);
    const summary = list.body.items[0];
    expect(summary).toMatchObject({ name: DEMO_BATCH_NAME, cells: ['C1', 'C2', 'C3', 'C4', 'C5', 'C6'], runs: ['1', '2'], pointCount: 312 });
    // Set points 0 to 60 kPa; the generated reference reads within a few pascals of them.
    expect(Math.abs(summary.referenceRange.min)).toBeLessThan(20);
    expect(Math.abs(summary.referenceRange.max - 60000)).toBeLessThan(20);
    expect(summary.notes).toMatch(/^Generated by the engine, not measured/);
    const dataset = await request(app).get(`/api/designs/${pressure.id}/datasets/${summary.id}`).set(bearer(token));
    const cell = dataset.body.points.filter((point: { cell: string }) => point.cell === 'C1');
    const analysis = analyseCell(cell, { direction: 'characteristic', degree: 2 });
    // The generator's hysteresis peaks at 0.5 mV of about 660 mV full scale; noise adds to it.
    expect(analysis.hysteresis?.percentFullScale).toBeGreaterThan(0.03);
    expect(analysis.hysteresis?.percentFullScale).toBeLessThan(0.3);
    expect(analysis.setpoints).toHaveLength(13);
  });
});
