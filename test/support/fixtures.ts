// Builders that put rows straight into the test database through the repositories, for suites
// that need many accounts, designs and reviews quickly (no HTTP round trip, no password hashing).
import { DESIGN_FORMAT_VERSION } from '@shared/contracts/design';
import { loadDesign } from '@shared/contracts/design-loader';
import demoPressure from '@shared/examples/demo-pressure.json';
import { issueSession } from '../../api/auth/session.service';
import type { UserRow } from '../../api/db/database';
import { insertDataset } from '../../api/datasets/dataset.repository';
import { insertDesign, type NewVersion } from '../../api/designs/design.repository';
import { computeKeyFigures } from '../../api/designs/key-figures';
import { insertComment, insertReview } from '../../api/reviews/review.repository';
import type { TestApp } from './test-app';

const demo = loadDesign(demoPressure);
if (!demo.ok) throw new Error('the demo pressure design does not load');
const demoDesign = demo.design;
const demoFigures = computeKeyFigures(demoDesign);

/** The demo pressure design as a version ready to store, with `notes` set when given. */
export function demoVersion(authorId: string, message = 'First version', notes?: string): NewVersion {
  const document = { ...demoDesign, ...(notes === undefined ? {} : { notes }) } as unknown as Record<string, unknown>;
  return { document, message, authorId, formatVersion: DESIGN_FORMAT_VERSION, engineVersion: 'test', figures: demoFigures };
}

/** A live session for the account, as sign-in would issue it; returns its Bearer header. */
export async function sessionOf({ db, config }: TestApp, user: UserRow): Promise<{ Authorization: string }> {
  const session = await issueSession(db, config, user, { userAgent: 'test', address: '127.0.0.1' });
  return { Authorization: `Bearer ${session.token}` };
}

export function storeDesign({ db }: TestApp, owner: UserRow, name: string): Promise<string> {
  return insertDesign(db, owner.id, name, demoVersion(owner.id));
}

/** A pending review of version 1 of the design, with one comment by the reviewer. */
export async function storeReview({ db }: TestApp, designId: string, requestedBy: UserRow, reviewer: UserRow): Promise<{ reviewId: string; commentId: string }> {
  const reviewId = await insertReview(db, { designId, versionNumber: 1, requestedBy: requestedBy.id, reviewerEmail: reviewer.email, reviewerId: reviewer.id, note: '' });
  const commentId = await insertComment(db, { reviewId, authorId: reviewer.id, parentId: null, stage: null, field: null, body: 'Please look at the ripple' });
  return { reviewId, commentId };
}

/** A small bench dataset of two points on the design. */
export function storeDataset({ db }: TestApp, designId: string, createdBy: UserRow): Promise<string> {
  const point = (row: number, reference: number, readout: number) => ({ row, cell: 'A', run: '1', direction: 'up' as const, reference, readout, time: null });
  return insertDataset(db, {
    designId,
    name: 'Bench run',
    notes: '',
    fileName: 'bench.csv',
    fileContent: Buffer.from('cell,run,dir,pressure,output\nA,1,up,0,1.5\nA,1,up,30,151\n'),
    mapping: { referenceColumn: 'pressure', readoutColumn: 'output' },
    units: { reference: 'Pa', referenceDisplay: 'kPa', readout: 'V', readoutDisplay: 'mV' },
    createdBy: createdBy.id,
    points: [point(2, 0, 0.0015), point(3, 30000, 0.151)],
  });
}
