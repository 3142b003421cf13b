import { meterProfileIds, meterProfileLabels, type JobDetail } from '@splitscope/contract';
import { useUpdateJob } from '@/lib/api/update-job';

/**
 * The meter this job's readings are taken with. Expected values and their bands follow it (the engine computes
 * them with the meter's test currents and accuracy), so a technician who picks up another meter changes it here.
 */
export function MeterSwitch({ job }: { job: JobDetail }) {
  const update = useUpdateJob(job.id);
  return (
    <label className="inline-flex min-h-11 max-w-full min-w-0 items-center gap-2 text-sm">
      <span className="font-medium">Meter</span>
      <select
        className="min-h-11 min-w-0 max-w-full rounded-md border border-stone-500 bg-white px-2"
        value={job.meterProfile ?? ''}
        disabled={update.isPending}
        onChange={(e) => update.mutate({ meterProfile: (e.target.value || null) as JobDetail['meterProfile'] })}
      >
        <option value="">{job.meter.from === 'job' ? "Shop's default meter" : `Shop's default: ${job.meter.label}`}</option>
        {meterProfileIds.map((id) => (
          <option key={id} value={id}>
            {meterProfileLabels[id]}
          </option>
        ))}
      </select>
      {update.error && (
        <span role="alert" className="text-high">
          {update.error.message}
        </span>
      )}
    </label>
  );
}
