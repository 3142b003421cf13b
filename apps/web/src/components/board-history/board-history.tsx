import { jobStatusLabels, type BoardHistory, type HistoryJob } from '@splitscope/contract';
import { Link } from 'react-router-dom';
import { Caution } from '@/components/ui/caution';
import { dateTime, verdictWord } from '@/lib/format';

const day = (iso: string) => new Date(iso).toLocaleDateString(undefined, { dateStyle: 'medium' });

/** The warranty flag: the board is back within the shop's warranty days of leaving after an earlier job. */
export function WarrantyFlag({ history }: { history: BoardHistory }) {
  const w = history.warranty;
  if (!w) return null;
  const earlier = history.jobs.find((j) => j.number === w.jobNumber);
  const fitted = earlier?.repairs
    .filter((r) => r.action === 'replaced')
    .map((r) => `${r.part}${r.replacementValue ? ` (${r.replacementValue})` : ''} replaced by ${r.byName}`);
  return (
    <div data-testid="warranty-flag">
      <Caution tone="warn" title={`Warranty return — back ${w.daysSince} ${w.daysSince === 1 ? 'day' : 'days'} after job #${w.jobNumber} left the shop`}>
        <p>
          Left on {day(w.leftAt)}; the shop’s warranty is {w.warrantyDays} days.
          {fitted?.length ? ` Last time: ${fitted.join('; ')}.` : ''}
        </p>
      </Caution>
    </div>
  );
}

function repairWords(r: HistoryJob['repairs'][number]) {
  const value = r.replacementValue ? ` with ${r.replacementValue}` : '';
  const marking = r.marking ? ` (marked ${r.marking})` : '';
  return `${r.part} ${r.action}${value}${marking} — ${r.byName}, ${day(r.at)}`;
}

function EarlierJob({ job }: { job: HistoryJob }) {
  return (
    <li className="rounded-md border border-stone-300 bg-white p-2">
      <details>
        <summary className="flex min-h-11 cursor-pointer flex-wrap items-center gap-x-2">
          <span className="font-semibold">Job #{job.number}</span>
          <span>{job.boardName}</span>
          <span className="text-sm text-stone-700">
            in {day(job.receivedAt)}
            {job.closedAt ? `, out ${day(job.closedAt)}` : ''} · {jobStatusLabels[job.status]} · by {job.matchedBy}
          </span>
        </summary>
        <div className="mt-2 space-y-2 text-sm">
          <p>
            {job.faultCode ? `Code ${job.faultCode} · ` : ''}
            {job.symptom} · {job.customerName}
          </p>
          {job.proposedPart && (
            <p>
              Faulty part found: <strong>{job.proposedPart}</strong>
            </p>
          )}
          <div>
            <p className="font-medium">Repairs</p>
            {job.repairs.length ? (
              <ul className="list-disc pl-5">
                {job.repairs.map((r) => (
                  <li key={`${r.part}-${r.at}`}>{repairWords(r)}</li>
                ))}
              </ul>
            ) : (
              <p className="text-stone-700">No repair recorded.</p>
            )}
          </div>
          {job.readings.length > 0 && (
            <div className="overflow-x-auto">
              <table className="w-full text-left">
                <caption className="text-left font-medium">Readings</caption>
                <thead>
                  <tr className="border-b border-stone-300">
                    <th scope="col" className="pr-2">
                      Where, meter function
                    </th>
                    <th scope="col" className="pr-2">
                      Read
                    </th>
                    <th scope="col" className="pr-2">
                      Verdict
                    </th>
                    <th scope="col">Taken</th>
                  </tr>
                </thead>
                <tbody>
                  {job.readings.map((r) => (
                    <tr key={`${r.takenAt}-${r.where}`} className="border-b border-stone-200 align-top">
                      <td className="pr-2">
                        {r.where}
                        {r.phase === 'verification' ? ' (verification)' : ''}
                      </td>
                      <td className="pr-2 font-mono">{r.raw}</td>
                      <td className="pr-2">{verdictWord(r.verdict)}</td>
                      <td>
                        {dateTime(r.takenAt)}, {r.byName}
                      </td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
          )}
          <Link className="inline-flex min-h-11 items-center text-board underline" to={`/jobs/${job.id}/report`}>
            Report of job #{job.number}
          </Link>
        </div>
      </details>
    </li>
  );
}

/** A board's earlier visits, newest first, each opening to its readings, repairs and who did them. */
export function EarlierJobs({ history }: { history: BoardHistory }) {
  if (!history.jobs.length) return <p className="text-sm text-stone-700">No earlier jobs with this serial.</p>;
  return (
    <ul aria-label="Earlier jobs" className="space-y-2">
      {history.jobs.map((j) => (
        <EarlierJob key={j.id} job={j} />
      ))}
    </ul>
  );
}

/** On a job: the warranty flag, and a link to the board's earlier visits when it had any. */
export function JobHistoryNote({ history, jobId }: { history: BoardHistory | undefined; jobId: string }) {
  if (!history?.jobs.length) return null;
  return (
    <div className="space-y-1">
      <WarrantyFlag history={history} />
      <Link className="inline-flex min-h-11 items-center text-sm text-board underline" to={`/jobs/${jobId}/history`}>
        This board was here before: {history.jobs.length} earlier {history.jobs.length === 1 ? 'job' : 'jobs'}
      </Link>
    </div>
  );
}

/** The flag over the earlier jobs: a serial's whole history on one screen. */
export function BoardHistoryView({ history }: { history: BoardHistory }) {
  return (
    <div className="space-y-2">
      <WarrantyFlag history={history} />
      <EarlierJobs history={history} />
    </div>
  );
}
