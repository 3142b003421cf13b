import { zodResolver } from '@hookform/resolvers/zod';
import { createRepairRequest, repairActions, type ExpectedReadingRow, type JobDetail } from '@splitscope/contract';
import { useState, type FormEvent } from 'react';
import { useForm } from 'react-hook-form';
import { Link, useParams } from 'react-router-dom';
import type { z } from 'zod';
import { MarkerGlyph } from '@/components/board-map/marker-glyph';
import { Caution } from '@/components/ui/caution';
import { QueryState } from '@/components/ui/query-state';
import { StatusBadge } from '@/components/ui/status-badge';
import { useJob } from '@/lib/api/get-job';
import { useReadings } from '@/lib/api/get-readings';
import { useUpdateJob } from '@/lib/api/update-job';
import { dateTime, METER_LABEL, meterText } from '@/lib/format';
import { parseTyped } from '@/lib/parse-reading';
import { useReadingSender } from '@/lib/use-reading-sender';
import { useCreateRepair } from '../api/create-repair';
import { useRepairs } from '@/lib/api/get-repairs';

type In = z.input<typeof createRepairRequest>;
type Out = z.output<typeof createRepairRequest>;
const input = 'mt-1 block min-h-11 w-full rounded-md border border-stone-500 bg-white px-3';

function RepairForm({ job }: { job: JobDetail }) {
  const create = useCreateRepair(job.id);
  const update = useUpdateJob(job.id);
  const form = useForm<In, unknown, Out>({
    resolver: zodResolver(createRepairRequest),
    defaultValues: { part: job.proposedPart ?? '', action: 'replaced', replacementValue: '', marking: '', notes: '' },
  });
  const submit = form.handleSubmit(async (v) => {
    await create.mutateAsync(v);
    if (job.allowedTransitions.includes('repaired')) await update.mutateAsync({ status: 'repaired' });
    form.reset({ ...v, notes: '' });
  });
  const err = create.error ?? update.error;
  return (
    <form onSubmit={submit} noValidate className="grid gap-3 rounded-lg border border-stone-300 bg-white p-3 sm:grid-cols-2">
      <h2 className="text-lg font-semibold sm:col-span-2">Record a repair action</h2>
      <label>
        <span className="text-sm font-medium">Part (designator)</span>
        <input className={input} {...form.register('part')} />
        {form.formState.errors.part && <span className="text-sm text-high">{form.formState.errors.part.message}</span>}
      </label>
      <label>
        <span className="text-sm font-medium">Action</span>
        <select className={input} {...form.register('action')}>
          {repairActions.map((a) => (
            <option key={a} value={a}>
              {a}
            </option>
          ))}
        </select>
      </label>
      <label>
        <span className="text-sm font-medium">Replacement value</span>
        <input className={input} {...form.register('replacementValue')} placeholder="e.g. 10k" />
      </label>
      <label>
        <span className="text-sm font-medium">Marking on the fitted part</span>
        <input className={input} {...form.register('marking')} />
      </label>
      <label className="sm:col-span-2">
        <span className="text-sm font-medium">Notes</span>
        <textarea rows={2} className={`${input} py-2`} {...form.register('notes')} />
      </label>
      {err && (
        <p role="alert" className="text-sm text-high sm:col-span-2">
          {err.message}
        </p>
      )}
      <div className="sm:col-span-2">
        <button type="submit" disabled={form.formState.isSubmitting} className="min-h-11 rounded-md bg-board px-4 font-semibold text-white">
          Save the repair
        </button>
      </div>
    </form>
  );
}

function VerifyRow({ row, onSave, latest }: { row: ExpectedReadingRow; onSave: (row: ExpectedReadingRow, text: string) => Promise<string | null>; latest?: { text: string; verdict: string | null; unsent?: boolean } }) {
  const [text, setText] = useState('');
  const [error, setError] = useState<string | null>(null);
  const submit = async (e: FormEvent) => {
    e.preventDefault();
    if (!text.trim()) return;
    const err = await onSave(row, text);
    setError(err);
    if (!err) setText('');
  };
  const label = row.label ?? `${row.red} → ${row.black}`;
  const test = `${METER_LABEL[row.mode]}, board ${row.power === 'on' ? 'powered' : 'unplugged'}`;
  return (
    <tr className="border-t border-stone-200 align-top">
      <td className="py-1 font-semibold">{label}</td>
      <td>
        {test}
      </td>
      <td className="tabular-nums">
        {meterText(row.expected, row.unit)}
        {row.low !== null && row.high !== null && (
          <span className="block text-xs text-stone-700">
            {meterText(row.low, row.unit)} – {meterText(row.high, row.unit)}
          </span>
        )}
      </td>
      <td>
        <form onSubmit={submit} className="flex gap-1">
          <input
            aria-label={`Verification reading for ${label} (${test})`}
            value={text}
            onChange={(e) => setText(e.target.value)}
            inputMode="decimal"
            autoComplete="off"
            className="min-h-11 w-28 rounded-md border border-stone-500 px-2 font-mono"
          />
          <button type="submit" className="min-h-11 rounded-md bg-board px-3 font-semibold text-white">
            Save
          </button>
        </form>
        {error && <span className="text-sm text-high">{error}</span>}
      </td>
      <td>
        {latest &&
          (latest.unsent ? (
            <span className="font-semibold text-amber-900">{latest.text} · unsent</span>
          ) : (
            <span className="inline-flex items-center gap-1 font-semibold">
              <MarkerGlyph state={latest.verdict === 'ok' ? 'healthy' : latest.verdict === 'low' ? 'low' : latest.verdict === 'high' ? 'high' : 'unmeasured'} />
              {latest.text} {latest.verdict === 'ok' ? 'healthy' : (latest.verdict ?? '')}
            </span>
          ))}
      </td>
    </tr>
  );
}

function Repair({ job }: { job: JobDetail }) {
  const repairs = useRepairs(job.id);
  const readings = useReadings(job.id);
  const sender = useReadingSender(job.id);
  const update = useUpdateJob(job.id);
  const verification = (readings.data?.items ?? []).filter((r) => r.phase === 'verification' && !r.supersededBy);
  const latestOf = (row: ExpectedReadingRow) => {
    const same = (a: { mode: string; red: string; black: string; power: string }) =>
      a.mode === row.mode && a.power === row.power && a.red.toLowerCase() === row.red.toLowerCase() && a.black.toLowerCase() === row.black.toLowerCase();
    const u = [...sender.unsent].reverse().find((x) => x.body.phase === 'verification' && same(x.body));
    if (u) return { text: u.body.raw, verdict: null, unsent: true };
    const r = [...verification].reverse().find((x) => same(x));
    return r ? { text: meterText(r.value, r.unit), verdict: r.verdict?.verdict ?? null } : undefined;
  };
  const save = async (row: ExpectedReadingRow, text: string) => {
    const p = await parseTyped(text, row.mode);
    if (!p.ok) return p.error;
    await sender.save({ mode: row.mode, red: row.red, black: row.black, power: row.power, lifted: row.lifted, value: p.value, raw: text.trim(), phase: 'verification' });
    return null;
  };
  const canVerify = job.allowedTransitions.includes('verified');
  const repaired = ['repaired', 'verified', 'returned'].includes(job.status);
  return (
    <div className="space-y-4">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <h1 className="text-2xl font-semibold">
          Repair and verification · job #{job.number}
        </h1>
        <StatusBadge status={job.status} />
      </div>
      <p>
        Approved part: <strong>{job.proposedPart ?? '—'}</strong> · {job.boardName}
      </p>
      <Caution title="Unplug the board and discharge the bus before desoldering">
        <p>Measure the bus below the safe threshold first. Follow your shop’s procedures, local codes and licensed practice.</p>
      </Caution>
      <QueryState query={repairs} label="repair actions">
        {(d) =>
          d.items.length > 0 ? (
            <ul className="rounded-lg border border-stone-300 bg-white p-3 text-sm">
              {d.items.map((r) => (
                <li key={r.id}>
                  {dateTime(r.createdAt)} · <strong>{r.part}</strong> {r.action}
                  {r.replacementValue ? ` with ${r.replacementValue}` : ''}
                  {r.marking ? ` (marked ${r.marking})` : ''} · {r.authorName}
                </li>
              ))}
            </ul>
          ) : (
            <p className="text-sm text-stone-700">No repair action recorded yet.</p>
          )
        }
      </QueryState>
      {['approved', 'repaired'].includes(job.status) && <RepairForm job={job} />}
      {repaired && (
        <section aria-labelledby="verify-h" className="space-y-2 rounded-lg border border-stone-300 bg-white p-3">
          <h2 id="verify-h" className="text-lg font-semibold">
            Verification readings against the expected table
          </h2>
          {sender.unsent.length > 0 && (
            <p role="status" className="rounded bg-amber-50 p-2 text-sm text-amber-950">
              {sender.unsent.length} reading(s) not sent yet: kept on this device and re-sent when the connection returns.
            </p>
          )}
          <div className="overflow-x-auto">
            <table className="w-full text-left text-sm">
              <thead>
                <tr>
                  <th>Test</th>
                  <th>Meter</th>
                  <th>Expected</th>
                  <th>Reading</th>
                  <th>Verdict</th>
                </tr>
              </thead>
              <tbody>
                {job.board.expectedReadings.map((row) => (
                  <VerifyRow key={row.id} row={row} onSave={save} latest={latestOf(row)} />
                ))}
              </tbody>
            </table>
          </div>
          {job.status === 'repaired' && !canVerify && (
            <p className="text-sm text-stone-700">A lead signs the repair off once the verification readings are healthy.</p>
          )}
          {job.status === 'repaired' && canVerify && (
            <div className="space-y-1">
              <button
                type="button"
                disabled={update.isPending}
                onClick={() => update.mutate({ status: 'verified' })}
                className="min-h-11 rounded-md bg-ok px-4 font-semibold text-white disabled:opacity-60"
              >
                Mark the board verified
              </button>
              {update.error && (
                <p role="alert" className="text-sm text-high">
                  {update.error.message}
                </p>
              )}
            </div>
          )}
        </section>
      )}
      <Link to={`/jobs/${job.id}/report`} className="inline-flex min-h-11 items-center font-semibold text-board underline">
        Repair report
      </Link>
    </div>
  );
}

function RepairPage() {
  const { id = '' } = useParams();
  const job = useJob(id);
  return <QueryState query={job} label="the job">{(j) => <Repair job={j} />}</QueryState>;
}

export default RepairPage;
