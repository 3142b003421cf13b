import { returnMethodLabels, returnMethods, type JobDetail, type ReturnMethod } from '@splitscope/contract';
import { useState, type FormEvent } from 'react';
import { useUpdateJob } from '@/lib/api/update-job';
import { dateTime } from '@/lib/format';

const today = () => new Date().toISOString().slice(0, 10);

/** Closes a verified job: the board went back to the customer on a date, by courier or collected. */
export function ReturnForm({ job }: { job: JobDetail }) {
  const update = useUpdateJob(job.id);
  const [via, setVia] = useState<ReturnMethod>('collected');
  const [date, setDate] = useState(today());
  if (job.status === 'returned')
    return (
      <p className="rounded-md bg-board-light p-3 font-semibold" data-testid="returned">
        Returned to the customer {job.closedAt ? dateTime(job.closedAt) : ''} · {job.returnedVia ? returnMethodLabels[job.returnedVia] : ''}
      </p>
    );
  if (!job.allowedTransitions.includes('returned')) return null;
  const submit = (e: FormEvent) => {
    e.preventDefault();
    // Noon local time of the chosen day, so the date does not shift across time zones.
    update.mutate({ status: 'returned', returnedVia: via, returnedAt: new Date(`${date}T12:00:00`).toISOString() });
  };
  return (
    <form onSubmit={submit} className="flex flex-wrap items-end gap-3 rounded-lg border border-stone-300 bg-white p-3">
      <h2 className="w-full text-lg font-semibold">Return to the customer</h2>
      <fieldset className="flex gap-3">
        <legend className="text-sm font-medium">How it left</legend>
        {returnMethods.map((m) => (
          <label key={m} className="flex min-h-11 items-center gap-2">
            <input type="radio" name="via" value={m} checked={via === m} onChange={() => setVia(m)} className="h-5 w-5" />
            {returnMethodLabels[m]}
          </label>
        ))}
      </fieldset>
      <label>
        <span className="block text-sm font-medium">Date</span>
        <input type="date" value={date} onChange={(e) => setDate(e.target.value)} className="min-h-11 rounded-md border border-stone-500 px-2" />
      </label>
      <button type="submit" disabled={update.isPending} className="min-h-11 rounded-md bg-board px-4 font-semibold text-white">
        Mark returned
      </button>
      {update.error && (
        <p role="alert" className="w-full text-sm text-high">
          {update.error.message}
        </p>
      )}
    </form>
  );
}
