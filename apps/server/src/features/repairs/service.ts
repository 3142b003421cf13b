import { and, asc, eq, inArray } from 'drizzle-orm';
import type { Repair } from '@splitscope/contract';
import type { Actor } from '../../auth/guards';
import type { Db } from '../../db/client';
import { repairActions, uploads, users } from '../../db/schema';
import { AppError } from '../../http/errors';
import { iso } from '../../lib/dates';
import { newId } from '../../lib/ids';
import { priorsChanged } from '../../lib/priors-generation';
import { getJobRow } from '../../db/job-row';
import { checkBinTake, takeFromBin } from '../parts-bin';

const toRepair = (r: typeof repairActions.$inferSelect, authorName: string): Repair => ({
  id: r.id,
  jobId: r.jobId,
  part: r.part,
  action: r.action,
  replacementValue: r.replacementValue,
  marking: r.marking,
  notes: r.notes,
  uploadIds: r.uploadIds,
  authorId: r.authorId,
  authorName,
  createdAt: iso(r.createdAt),
});

export async function createRepair({
  db,
  actor,
  jobId,
  input,
}: {
  db: Db;
  actor: Actor;
  jobId: string;
  input: {
    part: string;
    action: Repair['action'];
    replacementValue?: string | null;
    marking?: string | null;
    notes?: string | null;
    uploadIds: string[];
    binPartId?: string;
    binQuantity?: number;
  };
}): Promise<Repair> {
  const job = await getJobRow(db, actor.shopId, jobId);
  if (job.status !== 'approved' && job.status !== 'repaired')
    throw new AppError('conflict', `Repairs are recorded once the diagnosis is approved; this job is ${job.status}`);
  if (input.uploadIds.length) {
    const found = await db
      .select({ id: uploads.id })
      .from(uploads)
      .where(and(eq(uploads.shopId, actor.shopId), inArray(uploads.id, input.uploadIds)));
    const missing = input.uploadIds.filter((id) => !found.some((f) => f.id === id));
    if (missing.length)
      throw new AppError('invalid', `Unknown uploads: ${missing.join(', ')}`, { errors: [{ path: 'uploadIds', message: `unknown: ${missing.join(', ')}` }] });
  }
  const { binPartId } = input;
  if (binPartId && input.action !== 'replaced')
    throw new AppError('invalid', 'Only a replaced part comes from the parts bin', { errors: [{ path: 'binPartId', message: 'only with action replaced' }] });
  // A part from the bin is the board model's part (value and package checked); it records the drawer's value.
  const fitted = binPartId ? await checkBinTake({ db, shopId: actor.shopId, jobId, part: input.part, binPartId }) : null;
  const row = await db.transaction(async (tx) => {
    const [made] = await tx
      .insert(repairActions)
      .values({
        id: newId(),
        shopId: actor.shopId,
        jobId,
        part: input.part,
        action: input.action,
        replacementValue: input.replacementValue ?? fitted?.replacementValue ?? null,
        marking: input.marking ?? fitted?.marking ?? null,
        notes: input.notes ?? null,
        uploadIds: input.uploadIds,
        authorId: actor.id,
      })
      .returning();
    if (binPartId) await takeFromBin(tx, { shopId: actor.shopId, jobId, repairId: made!.id, binPartId, quantity: input.binQuantity ?? 1, takenBy: actor.id });
    return made!;
  });
  // a repair of a verified job is part of the shop's history, which steers other jobs' priors
  priorsChanged();
  return toRepair(row, actor.name);
}

export async function findRepairs({ db, shopId, jobId }: { db: Db; shopId: string; jobId: string }) {
  await getJobRow(db, shopId, jobId);
  const rows = await db
    .select({ r: repairActions, name: users.name })
    .from(repairActions)
    .innerJoin(users, eq(users.id, repairActions.authorId))
    .where(eq(repairActions.jobId, jobId))
    .orderBy(asc(repairActions.createdAt));
  return { items: rows.map(({ r, name }) => toRepair(r, name)) };
}
