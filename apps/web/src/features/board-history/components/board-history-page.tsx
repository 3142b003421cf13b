import { useState } from 'react';
import { Link, useParams, useSearchParams } from 'react-router-dom';
import { BoardHistoryView } from '@/components/board-history/board-history';
import { PageHeader } from '@/components/ui/page-header';
import { QueryState } from '@/components/ui/query-state';
import { useBoardHistory, useJobHistory } from '@/lib/api/get-board-history';
import { useJob } from '@/lib/api/get-job';

const field = 'mt-1 block min-h-11 w-full rounded-md border border-stone-500 bg-white px-3';

/** Jobs by board serial or unit serial: what the shop did to this board before. */
function SerialLookupPage() {
  const [params, setParams] = useSearchParams();
  const [serial, setSerial] = useState(params.get('serial') ?? '');
  const [unitSerial, setUnitSerial] = useState(params.get('unitSerial') ?? '');
  const history = useBoardHistory({ serial: params.get('serial') ?? undefined, unitSerial: params.get('unitSerial') ?? undefined });
  const asked = !!(params.get('serial') || params.get('unitSerial'));
  return (
    <section className="max-w-4xl space-y-4">
      <PageHeader title="Board history by serial" />
      <form
        className="grid gap-3 sm:grid-cols-[1fr_1fr_auto] sm:items-end"
        onSubmit={(e) => {
          e.preventDefault();
          const next = new URLSearchParams();
          if (serial.trim()) next.set('serial', serial.trim());
          if (unitSerial.trim()) next.set('unitSerial', unitSerial.trim());
          setParams(next);
        }}
      >
        <label className="block">
          <span className="text-sm font-medium">Board serial</span>
          <input className={field} value={serial} onChange={(e) => setSerial(e.target.value)} autoComplete="off" />
        </label>
        <label className="block">
          <span className="text-sm font-medium">Unit serial</span>
          <input className={field} value={unitSerial} onChange={(e) => setUnitSerial(e.target.value)} autoComplete="off" />
        </label>
        <button type="submit" className="min-h-11 rounded-md bg-board px-6 font-semibold text-white">
          Look up
        </button>
      </form>
      {asked &&
        (history.data || history.isPending || history.isError ? (
          <QueryState query={history} label="the serial's history">
            {(h) => <BoardHistoryView history={h} />}
          </QueryState>
        ) : (
          <p className="text-sm text-stone-700">Type at least three characters of a serial.</p>
        ))}
    </section>
  );
}

/** A job's board: its earlier visits as of the day this one came in, and the warranty flag. */
export function JobHistoryPage() {
  const { id = '' } = useParams();
  const job = useJob(id);
  const history = useJobHistory(id);
  return (
    <section className="max-w-4xl space-y-4">
      <PageHeader title={job.data ? `Job #${job.data.number}: earlier visits of this board` : 'Earlier visits of this board'}>
        <Link className="inline-flex min-h-11 items-center text-board underline" to={`/jobs/${id}`}>
          Back to the bench
        </Link>
      </PageHeader>
      {job.data && (
        <p className="text-sm text-stone-700">
          Board serial {job.data.serial ?? '—'} · unit serial {job.data.unitSerial ?? '—'} · {job.data.boardName}
        </p>
      )}
      <QueryState query={history} label="the board's history">
        {(h) => <BoardHistoryView history={h} />}
      </QueryState>
    </section>
  );
}

export default SerialLookupPage;
