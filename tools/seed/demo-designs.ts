import type { Kysely } from 'kysely';
import demoFlow from '@shared/examples/demo-flow.json';
import demoPressure from '@shared/examples/demo-pressure.json';
import type { Database } from '../../api/db/database';
import { appendVersion, insertDesign, type NewVersion } from '../../api/designs/design.repository';
import { newVersion } from '../../api/designs/new-version';
import { findUserByEmail } from '../../api/users/user.repository';

type Document = Record<string, unknown> & { excitation: Record<string, unknown>; chain: Array<Record<string, unknown>> };

/** A copy of a demo document with one stage's fields changed. */
function withStage(document: Document, id: string, changes: Record<string, unknown>): Document {
  return { ...document, chain: document.chain.map((stage) => (stage['id'] === id ? { ...stage, ...changes } : stage)) };
}

function withExcitation(document: Document, changes: Record<string, unknown>): Document {
  return { ...document, excitation: { ...document.excitation, ...changes } };
}

/**
 * The demo's design history, an invented story: the pressure chain began with a first-order
 * low-pass and a smaller excitation, and the flow chain with a lower pre-demodulator gain.
 */
function demoHistories(): Array<{ name: string; versions: Array<{ message: string; document: Document }> }> {
  const pressure = demoPressure as unknown as Document;
  const flow = demoFlow as unknown as Document;
  const pressureV1 = withExcitation(withStage(pressure, 'lp', { order: 1 }), { amplitude: 1 });
  const pressureV2 = withStage(pressure, 'lp', { order: 1 });
  const flowV1 = withStage(flow, 'g1', { gain: 10 });
  return [
    {
      name: 'Dispensing robot line sensor, pressure',
      versions: [
        { message: 'First cut: 1 V excitation, first-order low-pass', document: pressureV1 },
        { message: 'Excitation raised to 2 V for twice the sensitivity', document: pressureV2 },
        { message: 'Second-order low-pass to bring the carrier ripple under one LSB', document: pressure },
      ],
    },
    {
      name: 'Dispensing robot line sensor, flow',
      versions: [
        { message: 'Flow mode through the 20 mm capillary, gain 10', document: flowV1 },
        { message: 'Pre-demodulator gain raised for resolution', document: flow },
      ],
    },
  ];
}

function prepared(document: Document, message: string, authorId: string, engineVersion: string): NewVersion {
  const result = newVersion(document, message, authorId, engineVersion);
  if (!result.ok) throw new Error(`demo design "${message}" is not valid: ${result.errors.map((e) => `${e.path}: ${e.message}`).join('; ')}`);
  return result.version;
}

/** Adds the demo designer's designs when that account has none of that name; never touches existing ones. */
export async function seedDemoDesigns(db: Kysely<Database>, engineVersion: string): Promise<string[]> {
  const designer = await findUserByEmail(db, 'designer@example.com');
  if (!designer) return [];
  const created: string[] = [];
  for (const history of demoHistories()) {
    const existing = await db.selectFrom('designs').select('id').where('owner_id', '=', designer.id).where('name', '=', history.name).executeTakeFirst();
    if (existing) continue;
    const [first, ...rest] = history.versions;
    const id = await insertDesign(db, designer.id, history.name, prepared(first!.document, first!.message, designer.id, engineVersion));
    let base = 1;
    for (const step of rest) {
      const outcome = await appendVersion(db, id, base, prepared(step.document, step.message, designer.id, engineVersion));
      if (!outcome.saved) throw new Error(`demo design "${history.name}" changed while seeding`);
      base = outcome.number;
    }
    created.push(history.name);
  }
  return created;
}
