import { eq, sql } from 'drizzle-orm';
import { formatTaxRate, mailMilestoneSchema, type BillingSettings, type updateBillingSettingsRequest } from '@splitscope/contract';
import type { z } from 'zod';
import type { Db } from '../../db/client';
import { billingSettings } from '../../db/schema';

type Row = typeof billingSettings.$inferSelect;
type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];

export const toSettings = (r: Row): BillingSettings => ({
  currency: r.currency,
  taxRateMilliPercent: r.taxRateMilliPercent,
  taxRate: formatTaxRate(r.taxRateMilliPercent),
  notifyOn: r.notifyOn.filter((m) => mailMilestoneSchema.safeParse(m).success) as BillingSettings['notifyOn'],
  linkValidDays: r.linkValidDays,
  replyTo: r.replyTo,
});

/** The shop's settings row, created with the defaults on first use. */
export async function getSettingsRow(db: Db | Tx, shopId: string): Promise<Row> {
  await db.insert(billingSettings).values({ shopId }).onConflictDoNothing();
  const [row] = await db.select().from(billingSettings).where(eq(billingSettings.shopId, shopId));
  return row!;
}

export async function getBillingSettings({ db, shopId }: { db: Db; shopId: string }) {
  return toSettings(await getSettingsRow(db, shopId));
}

export async function updateBillingSettings({ db, shopId, input }: { db: Db; shopId: string; input: z.output<typeof updateBillingSettingsRequest> }) {
  const before = await getSettingsRow(db, shopId);
  const notifyOn = input.notifyOn ? [...new Set(input.notifyOn)] : undefined;
  // Milestones switched on now mail only status changes from now on, not the shop's history.
  const added = notifyOn?.some((m) => !before.notifyOn.includes(m));
  const [row] = await db
    .update(billingSettings)
    .set({
      ...(input.currency !== undefined && { currency: input.currency }),
      ...(input.taxRate !== undefined && { taxRateMilliPercent: input.taxRate }),
      ...(notifyOn && { notifyOn }),
      ...(added && { notifySince: new Date() }),
      ...(input.linkValidDays !== undefined && { linkValidDays: input.linkValidDays }),
      ...(input.replyTo !== undefined && { replyTo: input.replyTo }),
      updatedAt: new Date(),
    })
    .where(eq(billingSettings.shopId, shopId))
    .returning();
  return toSettings(row!);
}

/** Takes the shop's next quote or invoice number inside the caller's transaction (row lock: no gaps, no repeats). */
export async function takeNumber(tx: Tx, shopId: string, kind: 'quote' | 'invoice'): Promise<string> {
  await getSettingsRow(tx, shopId);
  const col = kind === 'quote' ? billingSettings.nextQuoteNumber : billingSettings.nextInvoiceNumber;
  const [row] = await tx
    .update(billingSettings)
    .set(kind === 'quote' ? { nextQuoteNumber: sql`${col} + 1` } : { nextInvoiceNumber: sql`${col} + 1` })
    .where(eq(billingSettings.shopId, shopId))
    .returning({ taken: sql<number>`${col} - 1` });
  return `${kind === 'quote' ? 'Q' : 'INV'}-${String(row!.taken).padStart(4, '0')}`;
}

export type { Tx };
