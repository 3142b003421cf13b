// Read-only access to the jobs, customers and boards that billing needs; the job tables belong to the jobs
// feature, and billing changes a job's status only through the flow's own transitions (see customer-portal).
import { and, eq } from 'drizzle-orm';
import type { Db } from '../../db/client';
import type { ShopCard } from '@splitscope/contract';
import { boardModels, customers, jobs, shops } from '../../db/schema';
import { AppError } from '../../http/errors';
import type { JobSummary } from '../mail';
import { toShopCard } from '../shops';

export interface BillingJob {
  id: string;
  shopId: string;
  number: number;
  status: (typeof jobs.$inferSelect)['status'];
  updatedAt: Date;
  unitDescription: string;
  serial: string | null;
  faultCode: string | null;
  symptom: string;
  proposedPart: string | null;
  receivedAt: Date;
  boardName: string | null;
  shop: ShopCard;
  customer: { id: string; name: string; company: string | null; email: string | null };
}

/** The job with its customer, board and shop; another shop's job answers 404. */
export async function getBillingJob(db: Db, shopId: string, jobId: string): Promise<BillingJob> {
  const [row] = await db
    .select({ job: jobs, customer: customers, boardName: boardModels.name, shop: shops })
    .from(jobs)
    .innerJoin(customers, eq(customers.id, jobs.customerId))
    .innerJoin(shops, eq(shops.id, jobs.shopId))
    .leftJoin(boardModels, eq(boardModels.id, jobs.boardId))
    .where(and(eq(jobs.id, jobId), eq(jobs.shopId, shopId)));
  if (!row) throw new AppError('not_found', `No job ${jobId}`);
  const j = row.job;
  return {
    id: j.id,
    shopId: j.shopId,
    number: j.number,
    status: j.status,
    updatedAt: j.updatedAt,
    unitDescription: j.unitDescription,
    serial: j.serial,
    faultCode: j.faultCode,
    symptom: j.symptom,
    proposedPart: j.proposedPart,
    receivedAt: j.receivedAt,
    boardName: row.boardName,
    shop: toShopCard(row.shop),
    customer: { id: row.customer.id, name: row.customer.name, company: row.customer.company, email: row.customer.email },
  };
}

export const jobSummary = (j: BillingJob): JobSummary => ({
  shop: j.shop,
  customerName: j.customer.name,
  jobNumber: j.number,
  unitDescription: j.unitDescription,
  boardName: j.boardName,
});

/**
 * Where a mail to the customer goes: the customer's address on file, and only there. A customer link opens
 * the job and answers its quotes as the customer, so it is never mailed to an address typed when sending; an
 * address asked for must be the one on file (to send elsewhere, change the customer's e-mail first).
 */
export function recipientOf(j: BillingJob, to: string | undefined): string {
  const address = j.customer.email;
  if (!address) throw new AppError('invalid', `${j.customer.name} has no e-mail address on file; add one to the customer first`);
  if (to !== undefined && to.trim().toLowerCase() !== address.trim().toLowerCase()) {
    throw new AppError('invalid', `Customer links go only to the customer's address on file (${address}); change the customer's e-mail to send elsewhere`, {
      errors: [{ path: 'to', message: "must be the customer's address on file" }],
    });
  }
  return address;
}

/** Who a link is mailed to, recorded with it (and with an answer given through it). */
export const recipientFor = (j: BillingJob, address: string) => ({ name: j.customer.name, email: address });
