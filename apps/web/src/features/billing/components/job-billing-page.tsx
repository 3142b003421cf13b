import { canBill, type BillingSettings, type JobBilling, type JobDetail, type Role } from '@splitscope/contract';
import { Link, useParams } from 'react-router-dom';
import { QueryState } from '@/components/ui/query-state';
import { StatusBadge } from '@/components/ui/status-badge';
import { useMe } from '@/lib/api/me';
import { useJob } from '@/lib/api/get-job';
import { useBillingSettings } from '../api/get-billing-settings';
import { useJobBilling } from '../api/get-job-billing';
import { InvoicesSection } from './invoices-section';
import { QuotesSection } from './quotes-section';
import { StatusMailSection } from './status-mail-section';

function Billing({ job, billing, settings, role }: { job: JobDetail; billing: JobBilling; settings: BillingSettings; role: Role | undefined }) {
  const ctx = { job, currency: settings.currency, defaultRate: settings.taxRate, canEdit: canBill(role) };
  return (
    <div className="mx-auto max-w-5xl space-y-6">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <h1 className="text-2xl font-semibold">Billing · job #{job.number}</h1>
        <StatusBadge status={job.status} sentBack={job.sentBack} />
      </div>
      <p>
        {job.customer.name}
        {job.customer.company ? ` (${job.customer.company})` : ''} · {job.customer.email ?? 'no e-mail on file'} · {job.unitDescription} · {job.boardName}
      </p>
      <nav aria-label="Job" className="flex flex-wrap gap-4">
        <Link to={`/jobs/${job.id}`} className="inline-flex min-h-11 items-center font-semibold text-board underline">
          Back to the bench
        </Link>
        <Link to={`/jobs/${job.id}/report`} className="inline-flex min-h-11 items-center font-semibold text-board underline">
          Repair report
        </Link>
        {role === 'admin' && (
          <Link to="/billing/settings" className="inline-flex min-h-11 items-center font-semibold text-board underline">
            Billing settings
          </Link>
        )}
      </nav>
      {!ctx.canEdit && (
        <p className="rounded bg-stone-200 p-2 text-sm">Trainees see the billing of a job; a technician, lead or shop admin quotes and invoices.</p>
      )}
      <QuotesSection quotes={billing.quotes} ctx={ctx} />
      <InvoicesSection invoices={billing.invoices} quotes={billing.quotes} ctx={ctx} />
      <StatusMailSection job={job} settings={settings} canEdit={ctx.canEdit} />
    </div>
  );
}

/** The job's billing panel: quotes, the invoice and status e-mails to the customer. */
export default function JobBillingPage() {
  const { id = '' } = useParams();
  const me = useMe();
  const job = useJob(id);
  const billing = useJobBilling(id);
  const settings = useBillingSettings();
  return (
    <QueryState query={job} label="the job">
      {(j) => (
        <QueryState query={settings} label="the billing settings">
          {(s) => (
            <QueryState query={billing} label="the job’s quotes and invoices">
              {(b) => <Billing job={j} billing={b} settings={s} role={me.data?.role} />}
            </QueryState>
          )}
        </QueryState>
      )}
    </QueryState>
  );
}
