import { canLiftGuidedOrder, guidedOrderBinds, type JobDetail } from '@splitscope/contract';
import { Button } from '@/components/ui/button';
import { useMe } from '@/lib/api/me';
import { useTraineeGuidedOrder } from '@/lib/api/trainee-guided-order';
import { useUpdateJob } from '@/lib/api/update-job';

/**
 * Guided order on or off. A trainee cannot switch it off (the server refuses readings out of order); a lead can
 * lift it for the job, or for the assigned trainee on all of their jobs, and put it back.
 */
export function GuidedSwitch({ job, guided, onToggle }: { job: JobDetail; guided: boolean; onToggle: () => void }) {
  const me = useMe();
  const update = useUpdateJob(job.id);
  const trainee = useTraineeGuidedOrder();
  const lead = canLiftGuidedOrder(me.data?.role);
  const onTrainee = job.assigneeGuidedLifted !== null && job.assigneeId !== null;
  // What the assigned trainee works under, by the same rule the server applies to their readings.
  const binds = onTrainee && guidedOrderBinds('trainee', { job: job.guidedLifted, trainee: job.assigneeGuidedLifted === true });
  const error = update.error ?? trainee.error;
  return (
    <div className="flex flex-wrap items-center gap-2">
      {job.guidedOrderRequired ? (
        <span
          className="inline-flex min-h-11 items-center rounded-md border border-board bg-board-light px-3 text-sm font-semibold"
          data-testid="guided-locked"
        >
          Guided order: on · a lead can lift it
        </span>
      ) : (
        <Button variant="secondary" aria-pressed={guided} onClick={onToggle}>
          Guided order: {guided ? 'on' : 'off'}
        </Button>
      )}
      {lead && onTrainee && (
        <details className="relative" data-testid="trainee-guided">
          <summary className="inline-flex min-h-11 cursor-pointer items-center rounded-md border border-stone-400 bg-white px-3 text-sm font-semibold">
            {job.assigneeName}: guided order {binds ? 'on' : 'lifted'}
          </summary>
          <div className="absolute right-0 z-20 mt-1 flex w-72 flex-col gap-2 rounded-md border border-stone-400 bg-white p-2 shadow-lg">
            <Button variant="secondary" disabled={update.isPending} onClick={() => update.mutate({ guidedLifted: !job.guidedLifted })}>
              {job.guidedLifted ? 'Hold to guided order on this job' : 'Lift guided order on this job'}
            </Button>
            <Button variant="secondary" disabled={trainee.isPending} onClick={() => trainee.mutate({ id: job.assigneeId!, lifted: !job.assigneeGuidedLifted })}>
              {job.assigneeGuidedLifted ? `Hold ${job.assigneeName} to guided order on all jobs` : `Lift guided order on all of ${job.assigneeName}’s jobs`}
            </Button>
          </div>
        </details>
      )}
      {error && (
        <span role="alert" className="text-sm text-high">
          {error.message}
        </span>
      )}
    </div>
  );
}
