import { reportReady, type JobDetail } from '@splitscope/contract';
import { useParams } from 'react-router-dom';
import { QueryState } from '@/components/ui/query-state';
import { useJob } from '@/lib/api/get-job';
import { useReadings } from '@/lib/api/get-readings';
import { useRepairs } from '@/lib/api/get-repairs';
import { dateTime, meterText } from '@/lib/format';
import type { StoredReading } from '@splitscope/contract';

const verdictWord = (v: 'ok' | 'low' | 'high' | undefined) => (v === 'ok' ? 'healthy' : v ?? '—');

function Report({ job }: { job: JobDetail }) {
  const readings = useReadings(job.id);
  const repairs = useRepairs(job.id);
  const items = (readings.data?.items ?? []).filter((r) => !r.supersededBy);
  const found = items.filter((r) => r.phase === 'diagnosis' && r.verdict && r.verdict.verdict !== 'ok');
  const verification = items.filter((r) => r.phase === 'verification');
  const approval = [...job.reviews].reverse().find((r) => r.decision === 'approve');
  return (
    <article className="report mx-auto max-w-3xl space-y-4 bg-white p-6 print:p-0">
      <header className="flex flex-wrap items-start justify-between gap-2 border-b border-stone-300 pb-3">
        <div>
          <h1 className="text-2xl font-semibold">Repair report · job #{job.number}</h1>
          <p>{job.board.name} (board model version {job.boardVersion})</p>
        </div>
        <button type="button" onClick={() => window.print()} className="no-print min-h-11 rounded-md bg-board px-4 font-semibold text-white">
          Print or save as PDF
        </button>
      </header>
      <section>
        <h2 className="text-lg font-semibold">Board and fault</h2>
        <dl className="grid grid-cols-[10rem_1fr] gap-y-1 text-sm">
          <dt>Customer</dt>
          <dd>
            {job.customer.name}
            {job.customer.company ? `, ${job.customer.company}` : ''}
          </dd>
          <dt>Unit</dt>
          <dd>
            {job.unitDescription}
            {job.serial ? ` · serial ${job.serial}` : ''}
          </dd>
          <dt>Received</dt>
          <dd>{dateTime(job.receivedAt)}</dd>
          <dt>Reported fault</dt>
          <dd>
            {job.faultCode ? `code ${job.faultCode} · ` : ''}
            {job.symptom}
          </dd>
          <dt>Faulty part</dt>
          <dd className="font-semibold" data-testid="report-part">
            {job.proposedPart ?? 'not determined'}
            {approval ? ` (approved by ${approval.reviewerName}, ${dateTime(approval.createdAt)})` : ''}
          </dd>
          <dt>Status</dt>
          <dd>{job.status}</dd>
        </dl>
      </section>
      <section>
        <h2 className="text-lg font-semibold">Readings that found it</h2>
        <QueryState query={readings} label="readings">
          {() =>
            found.length === 0 ? (
              <p className="text-sm">No out-of-band reading recorded.</p>
            ) : (
              <ReadingTable rows={found} />
            )
          }
        </QueryState>
      </section>
      <section>
        <h2 className="text-lg font-semibold">Repair</h2>
        <QueryState query={repairs} label="repairs">
          {(d) =>
            d.items.length === 0 ? (
              <p className="text-sm">No repair recorded.</p>
            ) : (
              <ul className="text-sm" data-testid="report-repairs">
                {d.items.map((r) => (
                  <li key={r.id}>
                    <strong>{r.part}</strong> {r.action}
                    {r.replacementValue ? ` with ${r.replacementValue}` : ''}
                    {r.marking ? ` (marked ${r.marking})` : ''} by {r.authorName}, {dateTime(r.createdAt)}
                    {r.notes ? ` — ${r.notes}` : ''}
                  </li>
                ))}
              </ul>
            )
          }
        </QueryState>
      </section>
      <section>
        <h2 className="text-lg font-semibold">Verification</h2>
        {verification.length === 0 ? <p className="text-sm">No verification reading recorded.</p> : <ReadingTable rows={verification} />}
        <p className="mt-2 text-sm font-semibold">{reportReady(job.status) ? 'The board was verified against its expected readings.' : 'The board is not verified yet.'}</p>
      </section>
      <footer className="border-t border-stone-300 pt-2 text-xs text-stone-700">
        Mains and the DC bus on this board are hazardous. Install and test it under your local electrical codes and licensed practice.
      </footer>
    </article>
  );

}

function ReadingTable({ rows }: { rows: StoredReading[] }) {
    return (
      <table className="w-full text-left text-sm">
        <thead>
          <tr className="border-b border-stone-300">
            <th>Red → black</th>
            <th>Meter</th>
            <th>Power</th>
            <th>Measured</th>
            <th>Expected band</th>
            <th>Verdict</th>
          </tr>
        </thead>
        <tbody>
          {rows.map((r) => (
            <tr key={r.id} className="border-b border-stone-200">
              <td className="py-0.5">
                {r.red} → {r.black}
              </td>
              <td>{r.mode}</td>
              <td>{r.power}</td>
              <td className="font-mono">{meterText(r.value, r.unit)}</td>
              <td>{r.verdict ? `${meterText(r.verdict.low, r.unit)} – ${meterText(r.verdict.high, r.unit)}` : '—'}</td>
              <td className="font-semibold">{verdictWord(r.verdict?.verdict)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    );
  }

export function ReportPage() {
  const { id = '' } = useParams();
  const job = useJob(id);
  return <QueryState query={job} label="the job">{(j) => <Report job={j} />}</QueryState>;
}

export default ReportPage;
