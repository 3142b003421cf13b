import { canLiftGuidedOrder, type JobDetail } from '@splitscope/contract';
import { Button } from '@/components/ui/button';
import { useMe } from '@/lib/api/me';
import { useUpdateJob } from '@/lib/api/update-job';

/**
 * Guided order on or off. A trainee cannot switch it off (the server refuses readings out of order); a lead can
 * lift it for the job, and put it back.
 */
export function GuidedSwitch({ job, guided, onToggle }: { job: JobDetail; guided: boolean; onToggle: () => void }) {
  const me = useMe();
  const update = useUpdateJob(job.id);
  const role = me.data?.role;
  const lead = role !== undefined && canLiftGuidedOrder(role);
  return (
    <div className="flex flex-wrap items-center gap-2">
      {job.guidedOrderRequired ? (
        <span className="inline-flex min-h-11 items-center rounded-md border border-board bg-board-light px-3 text-sm font-semibold" data-testid="guided-locked">
          Guided order: on · a lead can lift it for this job
        </span>
      ) : (
        <Button variant="secondary" aria-pressed={guided} onClick={onToggle}>
          Guided order: {guided ? 'on' : 'off'}
        </Button>
      )}
      {lead && (
        <Button variant="secondary" disabled={update.isPending} onClick={() => update.mutate({ guidedLifted: !job.guidedLifted })}>
          {job.guidedLifted ? 'Hold the trainee to guided order' : 'Lift guided order for the trainee'}
        </Button>
      )}
      {update.error && (
        <span role="alert" className="text-sm text-high">
          {update.error.message}
        </span>
      )}
    </div>
  );
}
