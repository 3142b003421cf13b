// The repair report the customer gets: what came in, what was found, what was done, and the verification
// readings, rendered as a PDF with pdfkit. Everything is read from the job's own rows.
import { and, asc, desc, eq } from 'drizzle-orm';
import PDFDocument from 'pdfkit';
import { jobStatusLabels } from '@splitscope/contract';
import type { Db } from '../../db/client';
import { readings, repairActions, reviews, users } from '../../db/schema';
import type { BillingJob } from './jobs';

export interface RepairReport {
  shopName: string;
  jobNumber: number;
  customer: string;
  unit: string;
  board: string | null;
  serial: string | null;
  faultCode: string | null;
  symptom: string;
  status: string;
  receivedAt: Date;
  finding: string | null;
  reviewedBy: string | null;
  repairs: { part: string; action: string; replacement: string | null; notes: string | null }[];
  verification: { points: string; mode: string; value: string; verdict: string | null }[];
}

function verdictText(v: unknown): string | null {
  if (v && typeof v === 'object') {
    const o = v as Record<string, unknown>;
    for (const k of ['status', 'verdict', 'result']) if (typeof o[k] === 'string') return o[k];
  }
  return null;
}

export async function loadRepairReport(db: Db, job: BillingJob): Promise<RepairReport> {
  const [approval] = await db
    .select({ name: users.name, part: reviews.proposedPart })
    .from(reviews)
    .innerJoin(users, eq(users.id, reviews.reviewerId))
    .where(and(eq(reviews.jobId, job.id), eq(reviews.decision, 'approve')))
    .orderBy(desc(reviews.createdAt))
    .limit(1);
  const repairs = await db.select().from(repairActions).where(eq(repairActions.jobId, job.id)).orderBy(asc(repairActions.createdAt));
  const checks = await db
    .select()
    .from(readings)
    .where(and(eq(readings.jobId, job.id), eq(readings.phase, 'verification')))
    .orderBy(asc(readings.createdAt));
  return {
    shopName: job.shopName,
    jobNumber: job.number,
    customer: job.customer.company ? `${job.customer.name} (${job.customer.company})` : job.customer.name,
    unit: job.unitDescription,
    board: job.boardName,
    serial: job.serial,
    faultCode: job.faultCode,
    symptom: job.symptom,
    status: jobStatusLabels[job.status],
    receivedAt: job.receivedAt,
    finding: approval?.part ?? job.proposedPart,
    reviewedBy: approval?.name ?? null,
    repairs: repairs.map((r) => ({ part: r.part, action: r.action, replacement: r.replacementValue, notes: r.notes })),
    verification: checks.map((c) => ({
      points: `${c.red} to ${c.black}`,
      mode: c.mode,
      value: c.overLimit ? 'OL' : c.raw,
      verdict: verdictText(c.verdict),
    })),
  };
}

/** Renders the report; resolves with the PDF bytes. */
export function renderReportPdf(r: RepairReport): Promise<Buffer> {
  const doc = new PDFDocument({ size: 'A4', margin: 50, info: { Title: `Repair report, job ${r.jobNumber}`, Author: r.shopName } });
  const chunks: Buffer[] = [];
  doc.on('data', (c: Buffer) => chunks.push(c));
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });

  doc.fontSize(18).text(r.shopName);
  doc.fontSize(14).text(`Repair report: job ${r.jobNumber}`).moveDown();
  const field = (label: string, value: string | null) => {
    if (value) doc.fontSize(10).font('Helvetica-Bold').text(`${label}: `, { continued: true }).font('Helvetica').text(value);
  };
  field('Customer', r.customer);
  field('Unit', r.unit);
  field('Board', r.board);
  field('Serial', r.serial);
  field('Fault code', r.faultCode);
  field('Reported symptom', r.symptom);
  field('Received', r.receivedAt.toISOString().slice(0, 10));
  field('Status', r.status);
  doc.moveDown();

  doc.fontSize(12).font('Helvetica-Bold').text('Finding').font('Helvetica').fontSize(10);
  doc.text(r.finding ? `Faulty part: ${r.finding}${r.reviewedBy ? ` (diagnosis reviewed by ${r.reviewedBy})` : ''}` : 'No finding recorded.').moveDown();

  doc.fontSize(12).font('Helvetica-Bold').text('Work done').font('Helvetica').fontSize(10);
  if (!r.repairs.length) doc.text('No repair actions recorded.');
  for (const a of r.repairs) {
    doc.text(`• ${a.part}: ${a.action}${a.replacement ? `, new part ${a.replacement}` : ''}${a.notes ? `. ${a.notes}` : ''}`);
  }
  doc.moveDown();

  doc.fontSize(12).font('Helvetica-Bold').text('Verification readings').font('Helvetica').fontSize(10);
  if (!r.verification.length) doc.text('No verification readings recorded.');
  for (const v of r.verification) doc.text(`• ${v.points} (${v.mode}): ${v.value}${v.verdict ? ` (${v.verdict})` : ''}`);
  doc.moveDown(2);
  doc
    .fontSize(8)
    .fillColor('#555')
    .text('Mains wiring and the DC bus of these boards are dangerous. Have the board installed by a qualified technician.');
  doc.end();
  return done;
}
