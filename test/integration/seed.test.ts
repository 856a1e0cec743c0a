import request from 'supertest';
import { afterAll, describe, expect, it } from 'vitest';
import { DEFAULT_DEMO_PASSWORD, seedDemoAccounts } from '../../tools/seed/demo-accounts';
import { seedDemoDesigns } from '../../tools/seed/demo-designs';
import { createTestApp, resetTables } from '../support/test-app';

const testApp = createTestApp();

afterAll(async () => {
  await testApp.db.destroy();
});

async function snapshot() {
  const users = await testApp.db.selectFrom('users').select(['email', 'password_hash', 'updated_at']).orderBy('email').execute();
  const versions = await testApp.db
    .selectFrom('design_versions')
    .innerJoin('designs', 'designs.id', 'design_versions.design_id')
    .select(['designs.name', 'design_versions.number', 'design_versions.created_at'])
    .orderBy('designs.name')
    .orderBy('design_versions.number')
    .execute();
  return { users, versions };
}

describe('demo seed', () => {
  it('creates the three demo accounts and two demo designs with their histories, and a second run changes nothing', async () => {
    await resetTables(testApp);
    expect(await seedDemoAccounts(testApp.db, DEFAULT_DEMO_PASSWORD, 10)).toEqual(['admin@example.com', 'designer@example.com', 'reviewer@example.com']);
    expect(await seedDemoDesigns(testApp.db, 'test')).toHaveLength(2);
    const first = await snapshot();
    expect(first.versions.map((v) => `${v.name} v${v.number}`)).toEqual([
      'Dispensing robot line sensor, flow v1',
      'Dispensing robot line sensor, flow v2',
      'Dispensing robot line sensor, pressure v1',
      'Dispensing robot line sensor, pressure v2',
      'Dispensing robot line sensor, pressure v3',
    ]);
    expect(await seedDemoAccounts(testApp.db, 'another-password-entirely', 10)).toEqual([]);
    expect(await seedDemoDesigns(testApp.db, 'test')).toEqual([]);
    expect(await snapshot()).toEqual(first);

    for (const email of ['admin@example.com', 'designer@example.com', 'reviewer@example.com']) {
      const response = await request(testApp.app).post('/api/auth/sign-in').send({ email, password: DEFAULT_DEMO_PASSWORD });
      expect(response.status).toBe(200);
    }
  });
});
