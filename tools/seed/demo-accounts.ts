import bcrypt from 'bcryptjs';
import type { Kysely } from 'kysely';
import type { Role } from '@shared/contracts/user';
import type { Database } from '../../api/db/database';
import { findUserByEmail, insertUser } from '../../api/users/user.repository';
import demoPassword from './demo-password.json';

/** The demo password when DEMO_PASSWORD is not set (documented in the README; `npm start` prints it). */
export const DEFAULT_DEMO_PASSWORD: string = demoPassword.defaultDemoPassword;

export const demoAccounts: ReadonlyArray<{ email: string; displayName: string; role: Role }> = [
  { email: 'admin@example.com', displayName: 'Demo Administrator', role: 'admin' },
  { email: 'designer@example.com', displayName: 'Demo Designer', role: 'designer' },
  { email: 'reviewer@example.com', displayName: 'Demo Reviewer', role: 'reviewer' },
];

/** Creates the demo accounts that are missing; an existing account is left exactly as it is. */
export async function seedDemoAccounts(db: Kysely<Database>, password: string, bcryptCost: number): Promise<string[]> {
  const created: string[] = [];
  let hash: string | undefined;
  for (const account of demoAccounts) {
    if (await findUserByEmail(db, account.email)) continue;
    hash ??= await bcrypt.hash(password, bcryptCost);
    await insertUser(db, { email: account.email, display_name: account.displayName, role: account.role, password_hash: hash });
    created.push(account.email);
  }
  return created;
}
