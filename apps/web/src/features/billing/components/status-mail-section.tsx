import { jobStatusLabels, mailMilestones, type BillingSettings, type JobDetail, type MailMilestone } from '@splitscope/contract';
import { SendForm } from './send-form';
import { useNotifyCustomer } from '../api/notify-customer';

const isMilestone = (s: string): s is MailMilestone => (mailMilestones as readonly string[]).includes(s);

/** Sends the customer a status e-mail for where the job is now; says which milestones go out on their own. */
export function StatusMailSection({ job, settings, canEdit }: { job: JobDetail; settings: BillingSettings; canEdit: boolean }) {
  const notify = useNotifyCustomer(job.id);
  const auto = settings.notifyOn.map((m) => jobStatusLabels[m]).join(', ');
  return (
    <section aria-labelledby="status-mail-h" className="space-y-2 rounded-lg border border-stone-300 bg-white p-3">
      <h2 id="status-mail-h" className="text-xl font-semibold">
        Status e-mail
      </h2>
      <p className="text-sm text-stone-700">
        {auto
          ? `Sent on their own when the job reaches: ${auto}.`
          : 'No status e-mails go out on their own; a shop admin switches them on in the billing settings.'}
      </p>
      {canEdit && isMilestone(job.status) && (
        <SendForm
          label={`E-mail “${jobStatusLabels[job.status]}” now`}
          defaultTo={job.customer.email}
          pending={notify.isPending}
          error={notify.error}
          sent={notify.data}
          onSend={(to) => notify.mutate(to)}
        />
      )}
      {canEdit && !isMilestone(job.status) && <p className="text-sm">The job’s current status ({jobStatusLabels[job.status]}) has no status e-mail.</p>}
    </section>
  );
}
