// The repair report's one model. The web's report page, the customer's PDF and the invoice e-mail that carries
// the PDF all render what this returns; none of them reads the job's rows on its own.
import { and, desc, eq } from 'drizzle-orm';
import {
  boardWords,
  wordsModelOf,
  reportReady,
  verificationReadings,
  type BoardWords,
  type RepairReport,
  type ReportReading,
  type StoredReading,
} from '@splitscope/contract';
import type { Db } from '../../db/client';
import { boardModels, boardModelVersions, customers, jobs, reviews, shops, users } from '../../db/schema';
import { AppError } from '../../http/errors';
import { iso, isoOrNull } from '../../lib/dates';
import type { Storage } from '../../storage/storage';
import { findReadings } from '../readings';
import { findRepairs } from '../repairs';
import { shopLogo, toShopCard } from '../shops';
import { renderReportPdf } from './pdf';

// Probe positions and parts in the bench's words (contract: boardWords), never the netlist's names.
const asReportReading =
  (w: BoardWords) =>
  ({ id, red, black, mode, power, lifted, alone, beep, value, unit, raw, verdict, takenAt }: StoredReading): ReportReading => ({
    id,
    red,
    black,
    mode,
    power,
    lifted,
    alone,
    beep,
    value,
    unit,
    raw,
    verdict,
    takenAt,
    probes: w.probes({ red, black, alone }),
    boardState: `${power === 'on' ? 'powered' : 'unplugged'}${lifted.length ? `, ${lifted.map(w.designator).join(', ')} lifted` : ''}`,
  });

export async function getRepairReport({ db, shopId, jobId }: { db: Db; shopId: string; jobId: string }): Promise<RepairReport> {
  const [row] = await db
    .select({
      job: jobs,
      customer: customers,
      shop: shops,
      board: boardModels.name,
      boardVersion: boardModelVersions.version,
      document: boardModelVersions.document,
    })
    .from(jobs)
    .innerJoin(customers, eq(customers.id, jobs.customerId))
    .innerJoin(shops, eq(shops.id, jobs.shopId))
    .innerJoin(boardModels, eq(boardModels.id, jobs.boardId))
    .innerJoin(boardModelVersions, eq(boardModelVersions.id, jobs.boardVersionId))
    .where(and(eq(jobs.id, jobId), eq(jobs.shopId, shopId)));
  if (!row) throw new AppError('not_found', `No job ${jobId}`);
  const { job } = row;
  const [approval] = await db
    .select({ name: users.name, part: reviews.proposedPart, at: reviews.createdAt })
    .from(reviews)
    .innerJoin(users, eq(users.id, reviews.reviewerId))
    .where(and(eq(reviews.jobId, jobId), eq(reviews.decision, 'approve')))
    .orderBy(desc(reviews.createdAt))
    .limit(1);
  const { items: repairs } = await findRepairs({ db, shopId, jobId });
  const { items: current } = await findReadings({ db, shopId, jobId, view: 'current' });
  const lastRepairAt = repairs.at(-1)?.createdAt ?? null;
  const words = boardWords(wordsModelOf(row.document));
  const counting = current.filter((r) => r.struck === null);
  return {
    jobId,
    jobNumber: job.number,
    shop: toShopCard(row.shop),
    customer: { name: row.customer.name, company: row.customer.company },
    unit: job.unitDescription,
    serial: job.serial,
    board: row.board,
    boardVersion: row.boardVersion,
    faultCode: job.faultCode,
    symptom: job.symptom,
    status: job.status,
    receivedAt: iso(job.receivedAt),
    finding: {
      part: (approval?.part ?? job.proposedPart) === null ? null : words.designator((approval?.part ?? job.proposedPart)!),
      reviewedBy: approval?.name ?? null,
      reviewedAt: isoOrNull(approval?.at),
    },
    foundBy: counting.filter((r) => r.phase === 'diagnosis' && ((r.verdict && r.verdict.verdict !== 'ok') || r.lifted.length > 0)).map(asReportReading(words)),
    repairs: repairs.map(({ id, part, action, replacementValue, marking, notes, authorName, createdAt }) => ({
      id,
      part,
      action,
      replacementValue,
      marking,
      notes,
      authorName,
      createdAt,
    })),
    verification: verificationReadings(counting, lastRepairAt).map(asReportReading(words)),
    verified: reportReady(job.status),
  };
}

/** The report as the customer gets it: the PDF, headed by the shop's logo. */
export async function reportPdf({ db, storage, shopId, jobId }: { db: Db; storage: Storage; shopId: string; jobId: string }): Promise<Buffer> {
  const [report, logo] = await Promise.all([getRepairReport({ db, shopId, jobId }), shopLogo({ db, storage, shopId })]);
  return renderReportPdf(report, logo?.bytes);
}
