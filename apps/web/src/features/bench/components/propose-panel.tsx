import { type JobDetail } from '@splitscope/contract';
import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { useUpdateJob } from '@/lib/api/update-job';
import type { RankedPart } from './ranking-panel';

/**
 * Propose a part for the lead's review: the candidate picked in the ranking (else the top one) and a note. The
 * lead, the repair and the report name the part as printed on the board.
 */
export function ProposePanel({ job, proposed, picked }: { job: JobDetail; proposed: RankedPart; picked: boolean }) {
  const update = useUpdateJob(job.id);
  const [note, setNote] = useState('');
  const propose = async () => {
    if (job.status === 'received') await update.mutateAsync({ status: 'diagnosing' });
    await update.mutateAsync({ status: 'awaiting-review', proposedPart: proposed.designator, proposalNote: note });
  };
  return (
    <section aria-labelledby="propose-h" className="space-y-2 rounded-lg border border-stone-300 bg-white p-3">
      <h2 id="propose-h" className="text-base font-semibold">
        Propose for review
      </h2>
      <p className="text-sm">
        <strong>{proposed.label}</strong>
        {!picked && <span className="text-stone-700"> (the top candidate; pick another in the list above)</span>}
      </p>
      <label className="block">
        <span className="text-sm font-medium">Note for the lead</span>
        <textarea
          rows={2}
          value={note}
          onChange={(e) => setNote(e.target.value)}
          className="mt-1 block w-full rounded-md border border-stone-500 p-2 text-sm"
          placeholder="What you saw, what you lifted, why this part"
        />
      </label>
      <Button onClick={() => void propose()} disabled={update.isPending}>
        Propose {proposed.designator} for review
      </Button>
      {update.error && (
        <p role="alert" className="text-sm text-high">
          {update.error.message}
        </p>
      )}
    </section>
  );
}
