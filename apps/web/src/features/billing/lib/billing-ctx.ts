import type { JobDetail } from '@splitscope/contract';

/** What every part of the billing panel needs: the job, the shop's currency and default rate, and whether the signed-in user may bill. */
export interface BillingCtx {
  job: JobDetail;
  currency: string;
  defaultRate: string;
  canEdit: boolean;
}
