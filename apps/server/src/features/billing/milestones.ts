// Status e-mails at the milestones a shop switched on. The job flow belongs to the jobs feature, so rather
// than hook into it this looks at the jobs table: a job whose status is a switched-on milestone, changed
// after the milestone was switched on, and not yet mailed for that status gets one e-mail. mail_log is the
// record of what went out, so each (job, status) is mailed once however often the sweep runs.
import { and, eq, gte, sql } from 'drizzle-orm';
import type { JobStatus } from '@splitscope/contract';
import type { Config } from '../../config';
import type { Db } from '../../db/client';
import { billingSettings, customers, jobs, mailLog } from '../../db/schema';
import { sendMail, statusMail } from '../mail';
import { getBillingJob, jobSummary, recipientFor, recipientOf } from './jobs';
import { createCustomerLink } from './links';

export async function sendDueStatusMail({ db, config, shopId }: { db: Db; config: Config; shopId?: string }): Promise<number> {
  const due = await db
    .select({ jobId: jobs.id, shopId: jobs.shopId, status: jobs.status, validDays: billingSettings.linkValidDays, replyTo: billingSettings.replyTo })
    .from(jobs)
    .innerJoin(billingSettings, eq(billingSettings.shopId, jobs.shopId))
    .innerJoin(customers, eq(customers.id, jobs.customerId))
    .where(
      and(
        shopId ? eq(jobs.shopId, shopId) : undefined,
        sql`${jobs.status}::text = any(${billingSettings.notifyOn})`,
        gte(jobs.updatedAt, billingSettings.notifySince),
        sql`${customers.email} is not null`,
        sql`not exists (select 1 from ${mailLog} where ${mailLog.jobId} = ${jobs.id} and ${mailLog.kind} = 'status:' || ${jobs.status}::text and ${mailLog.status} = 'sent')`,
      ),
    )
    .limit(50);
  let sent = 0;
  for (const d of due) {
    await sendStatusMail({ db, config, shopId: d.shopId, jobId: d.jobId, status: d.status, validDays: d.validDays, replyTo: d.replyTo }).then(
      () => sent++,
      (err: Error) => console.error(`mail: status e-mail for job ${d.jobId} not sent: ${err.message}`),
    );
  }
  return sent;
}

export async function sendStatusMail({
  db,
  config,
  shopId,
  jobId,
  status,
  validDays,
  replyTo,
  to,
  createdBy = null,
}: {
  db: Db;
  config: Config;
  shopId: string;
  jobId: string;
  status: JobStatus;
  validDays: number;
  replyTo: string | null;
  to?: string;
  createdBy?: string | null;
}) {
  const job = await getBillingJob(db, shopId, jobId);
  const address = recipientOf(job, to);
  const link = await createCustomerLink({ db, config, shopId, jobId, validDays, createdBy, recipient: recipientFor(job, address) });
  const content = statusMail(jobSummary(job), status, link);
  return sendMail({ config, db, mail: { shopId, jobId, kind: `status:${status}`, to: address, replyTo, ...content } });
}

/** Runs the sweep every `everyMs` until stopped; one sweep at a time. */
export function startStatusMailer({ db, config, everyMs = 15_000 }: { db: Db; config: Config; everyMs?: number }): () => void {
  let running = false;
  const timer = setInterval(() => {
    if (running) return;
    running = true;
    sendDueStatusMail({ db, config })
      .catch((err: Error) => console.error(`mail: status sweep failed: ${err.message}`))
      .finally(() => {
        running = false;
      });
  }, everyMs);
  timer.unref();
  return () => clearInterval(timer);
}
