import bcrypt from 'bcryptjs';
import { afterAll, describe, expect, it } from 'vitest';
import { turnsDuring } from '../../test/support/event-loop';
import { closePasswordWorkers, hashPassword, verifyPassword } from './password-hashing';

afterAll(() => closePasswordWorkers());

describe('password hashing in worker threads', () => {
  it('makes bcrypt hashes at the asked cost that bcrypt itself accepts, and checks them', async () => {
    const hash = await hashPassword('correct horse battery', 10);
    // Modular crypt format of bcrypt: $2b$<cost>$<22 salt><31 hash> (common practice).
    expect(hash).toMatch(/^\$2[aby]\$10\$[./A-Za-z0-9]{53}$/);
    expect(bcrypt.compareSync('correct horse battery', hash)).toBe(true);
    expect(await verifyPassword('correct horse battery', hash)).toBe(true);
    expect(await verifyPassword('correct horse batterY', hash)).toBe(false);
  });

  it('checks hashes made elsewhere by bcrypt', async () => {
    const hash = bcrypt.hashSync('made on the main thread', 4);
    expect(await verifyPassword('made on the main thread', hash)).toBe(true);
  });

  it('leaves the main thread free while a costly hash runs', async () => {
    await hashPassword('start the worker first', 4);
    // Cost 12 is 2^12 rounds: a quarter of a second or more. On the main thread no turn would run.
    const { turns } = await turnsDuring(() => hashPassword('a costly hash', 12));
    expect(turns).toBeGreaterThan(10);
  });
});
