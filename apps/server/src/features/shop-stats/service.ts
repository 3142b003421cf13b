import { and, desc, eq, inArray, ne, sql } from 'drizzle-orm';
import { median, warrantyReturn, type ShopStats } from '@splitscope/contract';
import type { Db } from '../../db/client';
import { billingSettings, boardModels, invoices, jobs, quotes, readings, repairActions } from '../../db/schema';
import { iso, isoOrNull } from '../../lib/dates';
import { getServiceTerms } from '../service-terms';

const SIGNED_OFF = ['verified', 'returned'] as const;
const HOUR_MS = 3_600_000;
const month = (col: unknown) => sql<string>`to_char(${col} at time zone 'UTC', 'YYYY-MM')`;

export async function shopStats({ db, shopId }: { db: Db; shopId: string }): Promise<ShopStats> {
  const { warrantyDays } = await getServiceTerms(db, shopId);
  const failuresByPart = await db
    .select({ boardName: boardModels.name, part: repairActions.part, count: sql<number>`count(distinct ${jobs.id})::int` })
    .from(repairActions)
    .innerJoin(jobs, eq(jobs.id, repairActions.jobId))
    .innerJoin(boardModels, eq(boardModels.id, jobs.boardId))
    .where(and(eq(jobs.shopId, shopId), inArray(jobs.status, SIGNED_OFF), eq(repairActions.action, 'replaced')))
    .groupBy(boardModels.name, repairActions.part)
    .orderBy(desc(sql`count(distinct ${jobs.id})`), boardModels.name, repairActions.part);

  const done = await db
    .select({
      id: jobs.id,
      number: jobs.number,
      serial: jobs.serial,
      boardName: boardModels.name,
      receivedAt: jobs.receivedAt,
      closedAt: jobs.closedAt,
      verifiedAt: sql<Date | null>`max(${readings.takenAt})`,
    })
    .from(jobs)
    .innerJoin(boardModels, eq(boardModels.id, jobs.boardId))
    .leftJoin(readings, and(eq(readings.jobId, jobs.id), eq(readings.phase, 'verification')))
    .where(and(eq(jobs.shopId, shopId), inArray(jobs.status, SIGNED_OFF)))
    .groupBy(jobs.id, boardModels.name);
  const hoursByBoard = new Map<string, number[]>();
  for (const j of done) {
    if (!j.verifiedAt) continue;
    const h = (new Date(j.verifiedAt).getTime() - j.receivedAt.getTime()) / HOUR_MS;
    hoursByBoard.set(j.boardName, [...(hoursByBoard.get(j.boardName) ?? []), h]);
  }
  const round1 = (n: number) => Math.round(n * 10) / 10;
  const intakeToVerified = [...hoursByBoard]
    .map(([boardName, hs]) => ({ boardName, jobs: hs.length, medianHours: round1(median(hs)), longestHours: round1(Math.max(...hs)) }))
    .sort((a, b) => a.boardName.localeCompare(b.boardName));

  // Every job with a serial (any status): a board back within the warranty days of an earlier visit is a repeat.
  const all = await db
    .select({ number: jobs.number, serial: jobs.serial, receivedAt: jobs.receivedAt, closedAt: jobs.closedAt, boardName: boardModels.name })
    .from(jobs)
    .innerJoin(boardModels, eq(boardModels.id, jobs.boardId))
    .where(and(eq(jobs.shopId, shopId), sql`${jobs.serial} is not null`));
  const bySerial = new Map<string, typeof all>();
  for (const j of all) bySerial.set(j.serial!.toLowerCase(), [...(bySerial.get(j.serial!.toLowerCase()) ?? []), j]);
  const repeatReturns: ShopStats['repeatReturns'] = [];
  for (const visits of bySerial.values()) {
    for (const j of visits) {
      const earlier = visits.filter((v) => v.receivedAt < j.receivedAt).map((v) => ({ number: v.number, closedAt: isoOrNull(v.closedAt) }));
      const flag = warrantyReturn(earlier, iso(j.receivedAt), warrantyDays);
      if (flag)
        repeatReturns.push({ jobNumber: j.number, earlierJobNumber: flag.jobNumber, serial: j.serial!, boardName: j.boardName, daysSince: flag.daysSince });
    }
  }
  repeatReturns.sort((a, b) => b.jobNumber - a.jobNumber);
  const cameBack = new Set(repeatReturns.map((r) => r.earlierJobNumber));
  const withSerial = done.filter((j) => j.serial);
  const firstTimeFix = { fixed: withSerial.filter((j) => !cameBack.has(j.number)).length, total: withSerial.length, warrantyDays };

  const quoted = await db
    .select({ month: month(quotes.createdAt), cents: sql<number>`sum(${quotes.totalCents})::float8` })
    .from(quotes)
    .where(and(eq(quotes.shopId, shopId), ne(quotes.status, 'draft')))
    .groupBy(month(quotes.createdAt));
  const invoiced = await db
    .select({ month: month(invoices.issuedAt), cents: sql<number>`sum(${invoices.totalCents})::float8`, paid: sql<number>`sum(${invoices.paidCents})::float8` })
    .from(invoices)
    .where(and(eq(invoices.shopId, shopId), ne(invoices.status, 'void')))
    .groupBy(month(invoices.issuedAt));
  const months = [...new Set([...quoted.map((q) => q.month), ...invoiced.map((i) => i.month)])].sort();
  const money = months.map((m) => ({
    month: m,
    quotedCents: Math.round(quoted.find((q) => q.month === m)?.cents ?? 0),
    invoicedCents: Math.round(invoiced.find((i) => i.month === m)?.cents ?? 0),
    paidCents: Math.round(invoiced.find((i) => i.month === m)?.paid ?? 0),
  }));
  const [settings] = await db.select({ currency: billingSettings.currency }).from(billingSettings).where(eq(billingSettings.shopId, shopId));
  return { failuresByPart, intakeToVerified, firstTimeFix, repeatReturns, money, currency: settings?.currency ?? 'usd' };
}
