import { hasRole, jobStatusLabels, ROLES, type RepairReport, type ReportReading } from '@splitscope/contract';
import { useParams } from 'react-router-dom';
import { JobPhotos } from '@/components/photos/job-photos';
import { QueryState } from '@/components/ui/query-state';
import { bandText, dateTime, METER_LABEL, readingText, verdictWord } from '@/lib/format';
import { useMe } from '@/lib/api/me';
import { usePromoteReference } from '../api/promote-reference';
import { useReport } from '../api/get-report';

/** A lead keeps a signed-off repair's verification readings as a known-good reference of the board model. */
function KeepAsReference({ jobId }: { jobId: string }) {
  const me = useMe();
  const promote = usePromoteReference(jobId);
  if (!hasRole(me.data?.role, ROLES.reviewers)) return null;
  return (
    <div className="no-print text-sm">
      <button
        type="button"
        disabled={promote.isPending || promote.isSuccess}
        onClick={() => promote.mutate(null)}
        className="min-h-11 rounded-md border border-stone-400 bg-white px-3 font-semibold"
      >
        Keep the verification readings as a known-good reference
      </button>
      {promote.isSuccess && <p role="status">Kept: the board model now has {promote.data.sets.length} known-good boards.</p>}
      {promote.isError && (
        <p role="alert" className="text-high">
          {promote.error.message}
        </p>
      )}
    </div>
  );
}

/** The report as the server composes it (the same model the customer's PDF is drawn from). */
function Report({ report: r }: { report: RepairReport }) {
  return (
    <article className="report mx-auto max-w-3xl space-y-4 bg-white p-6 print:p-0">
      <header className="flex flex-wrap items-start justify-between gap-2 border-b border-stone-300 pb-3">
        <div>
          <h1 className="text-2xl font-semibold">Repair report · job #{r.jobNumber}</h1>
          <p>
            {r.board} (board model version {r.boardVersion})
          </p>
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
            {r.customer.name}
            {r.customer.company ? `, ${r.customer.company}` : ''}
          </dd>
          <dt>Unit</dt>
          <dd>
            {r.unit}
            {r.serial ? ` · serial ${r.serial}` : ''}
          </dd>
          <dt>Received</dt>
          <dd>{dateTime(r.receivedAt)}</dd>
          <dt>Reported fault</dt>
          <dd>
            {r.faultCode ? `code ${r.faultCode} · ` : ''}
            {r.symptom}
          </dd>
          <dt>Faulty part</dt>
          <dd className="font-semibold" data-testid="report-part">
            {r.finding.part ?? 'not determined'}
            {r.finding.reviewedBy && r.finding.reviewedAt ? ` (approved by ${r.finding.reviewedBy}, ${dateTime(r.finding.reviewedAt)})` : ''}
          </dd>
          <dt>Status</dt>
          <dd>{jobStatusLabels[r.status]}</dd>
        </dl>
      </section>
      <JobPhotos jobId={r.jobId} compact />
      <section>
        <h2 className="text-lg font-semibold">Readings that found it</h2>
        {r.foundBy.length === 0 ? <p className="text-sm">No out-of-band reading recorded.</p> : <ReadingTable rows={r.foundBy} />}
      </section>
      <section>
        <h2 className="text-lg font-semibold">Repair</h2>
        {r.repairs.length === 0 ? (
          <p className="text-sm">No repair recorded.</p>
        ) : (
          <ul className="text-sm" data-testid="report-repairs">
            {r.repairs.map((a) => (
              <li key={a.id}>
                <strong>{a.part}</strong> {a.action}
                {a.replacementValue ? ` with ${a.replacementValue}` : ''}
                {a.marking ? ` (marked ${a.marking})` : ''} by {a.authorName}, {dateTime(a.createdAt)}
                {a.notes ? ` — ${a.notes}` : ''}
              </li>
            ))}
          </ul>
        )}
      </section>
      <section>
        <h2 className="text-lg font-semibold">Verification</h2>
        {r.verified && <KeepAsReference jobId={r.jobId} />}
        {r.verification.length === 0 ? <p className="text-sm">No verification reading recorded.</p> : <ReadingTable rows={r.verification} />}
        <p className="mt-2 text-sm font-semibold">{r.verified ? 'The board was verified against its expected readings.' : 'The board is not verified yet.'}</p>
      </section>
      <footer className="border-t border-stone-300 pt-2 text-xs text-stone-700">
        Mains and the DC bus on this board are hazardous. Install and test it under your local electrical codes and licensed practice.
      </footer>
    </article>
  );
}

function ReadingTable({ rows }: { rows: ReportReading[] }) {
  return (
    <table className="w-full text-left text-sm">
      <thead>
        <tr className="border-b border-stone-300">
          <th>Probes</th>
          <th>Meter</th>
          <th>Board</th>
          <th>Measured</th>
          <th>Expected band</th>
          <th>Verdict</th>
        </tr>
      </thead>
      <tbody>
        {rows.map((r) => (
          <tr key={r.id} className="border-b border-stone-200">
            <td className="py-0.5">{r.probes}</td>
            <td>{METER_LABEL[r.mode]}</td>
            <td data-testid="board-state">{r.boardState}</td>
            <td className="font-mono">{readingText(r)}</td>
            <td>{r.verdict ? bandText(r.verdict, r.mode) : '—'}</td>
            <td className="font-semibold">{verdictWord(r.verdict?.verdict)}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}

function ReportPage() {
  const { id = '' } = useParams();
  const report = useReport(id);
  return (
    <QueryState query={report} label="the report">
      {(r) => <Report report={r} />}
    </QueryState>
  );
}

export default ReportPage;
