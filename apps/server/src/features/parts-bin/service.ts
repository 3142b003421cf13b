import { and, asc, eq, gte, sql } from 'drizzle-orm';
import { centsToDecimal, needsReorder, type BinPart, type BinPartInput, type QuoteDraft } from '@splitscope/contract';
import type { Db } from '../../db/client';
import { binParts, binTakes, boardModelVersions, repairActions } from '../../db/schema';
import { AppError } from '../../http/errors';
import { newId } from '../../lib/ids';
import { getJobRow } from '../../db/job-row';
import { getServiceTerms } from '../service-terms';
import { assertFits, valueOf } from './fit';

type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];
type BinRow = typeof binParts.$inferSelect;

const toBinPart = (r: BinRow): BinPart => ({
  id: r.id,
  value: r.value,
  nominal: r.nominal,
  package: r.package,
  rating: r.rating,
  marking: r.marking,
  quantity: r.quantity,
  drawer: r.drawer,
  minimum: r.minimum,
  unitCents: r.unitCents,
  reorder: needsReorder(r),
});

async function binRow(db: Db | Tx, shopId: string, id: string): Promise<BinRow> {
  const [row] = await db
    .select()
    .from(binParts)
    .where(and(eq(binParts.id, id), eq(binParts.shopId, shopId)));
  if (!row) throw new AppError('not_found', `No drawer ${id} in the parts bin`);
  return row;
}

export async function findBinParts({ db, shopId, reorderOnly = false }: { db: Db; shopId: string; reorderOnly?: boolean }) {
  const where = [eq(binParts.shopId, shopId)];
  if (reorderOnly) where.push(sql`${binParts.quantity} < ${binParts.minimum}`);
  const rows = await db
    .select()
    .from(binParts)
    .where(and(...where))
    .orderBy(asc(binParts.drawer), asc(binParts.value));
  return { items: rows.map(toBinPart) };
}

export async function createBinPart({ db, shopId, input }: { db: Db; shopId: string; input: BinPartInput }): Promise<BinPart> {
  const nominal = valueOf(input.value);
  const [row] = await db
    .insert(binParts)
    .values({ id: newId(), shopId, ...input, rating: input.rating ?? null, marking: input.marking ?? null, nominal })
    .returning();
  return toBinPart(row!);
}

export async function updateBinPart({ db, shopId, id, input }: { db: Db; shopId: string; id: string; input: Partial<BinPartInput> }): Promise<BinPart> {
  await binRow(db, shopId, id);
  const set: Partial<typeof binParts.$inferInsert> = { ...input, updatedAt: new Date() };
  if (input.value !== undefined) set.nominal = valueOf(input.value);
  const [row] = await db.update(binParts).set(set).where(eq(binParts.id, id)).returning();
  return toBinPart(row!);
}

/**
 * Before a repair fits a part from the bin: the drawer is the shop's and its part is the board model's part (same
 * value, same package). Answers what the repair records as the fitted value and marking.
 */
export async function checkBinTake({ db, shopId, jobId, part, binPartId }: { db: Db; shopId: string; jobId: string; part: string; binPartId: string }) {
  const job = await getJobRow(db, shopId, jobId);
  const bin = await binRow(db, shopId, binPartId);
  const [version] = await db.select({ document: boardModelVersions.document }).from(boardModelVersions).where(eq(boardModelVersions.id, job.boardVersionId));
  assertFits(version?.document, part, { value: bin.value, nominal: bin.nominal, package: bin.package });
  return { replacementValue: bin.value, marking: bin.marking };
}

/** Inside the repair's transaction: the stock goes down, or the repair is not stored (never below zero). */
export async function takeFromBin(tx: Tx, o: { shopId: string; jobId: string; repairId: string; binPartId: string; quantity: number; takenBy: string }) {
  const [left] = await tx
    .update(binParts)
    .set({ quantity: sql`${binParts.quantity} - ${o.quantity}`, updatedAt: new Date() })
    .where(and(eq(binParts.id, o.binPartId), eq(binParts.shopId, o.shopId), gte(binParts.quantity, o.quantity)))
    .returning({ quantity: binParts.quantity });
  if (!left) {
    const bin = await binRow(tx, o.shopId, o.binPartId);
    throw new AppError('conflict', `Drawer ${bin.drawer} holds ${bin.quantity} of ${bin.value} ${bin.package}; the repair asks for ${o.quantity}`);
  }
  await tx
    .insert(binTakes)
    .values({ id: newId(), shopId: o.shopId, binPartId: o.binPartId, jobId: o.jobId, repairId: o.repairId, quantity: o.quantity, takenBy: o.takenBy });
}

/**
 * Quote lines pre-filled for a job: one part line per drawer the job's repairs took from, at the drawer's price,
 * and one labour line at the shop's rate for its bench time per repair. The quote form edits them before saving.
 */
export async function quoteDraft({ db, shopId, jobId }: { db: Db; shopId: string; jobId: string }): Promise<QuoteDraft> {
  await getJobRow(db, shopId, jobId);
  const taken = await db
    .select({ part: repairActions.part, quantity: binTakes.quantity, bin: binParts })
    .from(binTakes)
    .innerJoin(binParts, eq(binParts.id, binTakes.binPartId))
    .innerJoin(repairActions, eq(repairActions.id, binTakes.repairId))
    .where(eq(binTakes.jobId, jobId))
    .orderBy(asc(binTakes.createdAt));
  const [repairs] = await db
    .select({ n: sql<number>`count(*)::int` })
    .from(repairActions)
    .where(eq(repairActions.jobId, jobId));
  const terms = await getServiceTerms(db, shopId);
  const parts = taken.map(({ part, quantity, bin }) => ({
    kind: 'part' as const,
    description: `${part}: ${bin.value} ${bin.package}${bin.rating ? `, ${bin.rating}` : ''}`,
    quantity: String(quantity),
    unitCents: bin.unitCents,
    taxable: true,
  }));
  const hours = ((repairs?.n ?? 0) * terms.repairMinutes) / 60;
  const labour =
    hours > 0
      ? [
          {
            kind: 'labour' as const,
            description: `Bench labour (${repairs!.n} ${repairs!.n === 1 ? 'repair' : 'repairs'})`,
            quantity: centsToDecimal(Math.round(hours * 100)).replace(/\.?0+$/, ''),
            unitCents: terms.labourRateCents,
            taxable: true,
          },
        ]
      : [];
  return { lines: [...parts, ...labour] };
}
