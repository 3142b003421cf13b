import { jobStatusLabels, type JobStatus } from '@splitscope/contract';

const tone: Record<JobStatus, string> = {
  received: 'bg-stone-200 text-stone-900',
  diagnosing: 'bg-sky-100 text-sky-950',
  'awaiting-review': 'bg-amber-100 text-amber-950',
  approved: 'bg-emerald-100 text-emerald-950',
  repaired: 'bg-violet-100 text-violet-950',
  verified: 'bg-green-200 text-green-950',
  returned: 'bg-stone-300 text-stone-900',
};

export function StatusBadge({ status, sentBack }: { status: JobStatus; sentBack?: boolean }) {
  return (
    <span className={`inline-block rounded px-2 py-0.5 text-sm font-medium ${tone[status]}`}>
      {jobStatusLabels[status]}
      {sentBack && status === 'diagnosing' ? ' · sent back' : ''}
    </span>
  );
}
