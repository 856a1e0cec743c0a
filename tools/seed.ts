// `npm run seed`: the demo accounts (and, as the product grows, its demo data). Idempotent.
import { loadConfig } from '../api/config';
import { createDatabase } from '../api/db/database';
import { version } from '../api/version';
import { DEFAULT_DEMO_PASSWORD, seedDemoAccounts } from './seed/demo-accounts';
import { seedDemoCalibration } from './seed/demo-calibration';
import { seedDemoDesigns } from './seed/demo-designs';

const config = loadConfig();
const password = process.env.DEMO_PASSWORD || DEFAULT_DEMO_PASSWORD;
if (password.length < 10) {
  process.stderr.write('[seed] DEMO_PASSWORD must be at least 10 characters\n');
  process.exit(1);
}
const db = createDatabase(config.databaseUrl, { max: 2 });
try {
  const created = await seedDemoAccounts(db, password, config.bcryptCost);
  process.stdout.write(created.length ? `[seed] created ${created.join(', ')}\n` : '[seed] demo accounts already present; nothing changed\n');
  const designs = await seedDemoDesigns(db, version);
  process.stdout.write(designs.length ? `[seed] created demo designs: ${designs.join('; ')}\n` : '[seed] demo designs already present; nothing changed\n');
  const batches = await seedDemoCalibration(db);
  process.stdout.write(batches.length ? `[seed] created demo calibration batch: ${batches.join('; ')}\n` : '[seed] demo calibration batch already present; nothing changed\n');
} finally {
  await db.destroy();
}
