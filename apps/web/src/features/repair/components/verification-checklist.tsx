import {
  boardWords,
  unprovenRows,
  verificationChecklist,
  verificationReadings,
  type ExpectedReadingRow,
  type JobDetail,
  type StoredReading,
} from '@splitscope/contract';
import { useMemo, useState, type FormEvent } from 'react';
import { MarkerGlyph } from '@/components/board-map/marker-glyph';
import { SafetyGate } from '@/components/safety-gate';
import { boardView } from '@/lib/board/board-view';
import { gateRefusalFor } from '@/lib/board/gate';
import { gateFigures } from '@/lib/board/gate-figures';
import { bandText, METER_LABEL, readingText } from '@/lib/format';
import { parseTyped } from '@/lib/parse-reading';
import { useReadingSender } from '@/lib/use-reading-sender';
import { useRepairs } from '@/lib/api/get-repairs';
import { useUpdateJob } from '@/lib/api/update-job';
import { formSubmit } from '@/lib/form-submit';

const stateOf = (v: string | null | undefined) =>
  (v === 'ok' ? 'healthy' : v === 'low' ? 'low' : v === 'high' ? 'high' : 'unmeasured') as 'healthy' | 'low' | 'high' | 'unmeasured';

function Row({
  row,
  label,
  latest,
  onSave,
}: {
  row: ExpectedReadingRow;
  label: string;
  latest?: { text: string; verdict: string | null; unsent?: boolean };
  onSave: (row: ExpectedReadingRow, text: string) => Promise<string | null>;
}) {
  const [text, setText] = useState('');
  const [error, setError] = useState<string | null>(null);
  const test = `${label} · ${METER_LABEL[row.mode]} · ${row.power === 'on' ? 'powered' : 'unplugged'}`;
  const submit = async (e: FormEvent) => {
    e.preventDefault();
    if (!text.trim()) return;
    const err = await onSave(row, text);
    setError(err);
    if (!err) setText('');
  };
  return (
    <li className="grid items-center gap-2 border-t border-stone-200 py-2 sm:grid-cols-[1fr_9rem_12rem_10rem]">
      <span>
        <span className="font-semibold">{label}</span>
        <span className="block text-xs text-stone-700">
          {METER_LABEL[row.mode]} · {row.power === 'on' ? 'board powered' : 'unplugged, bus discharged'}
        </span>
      </span>
      <span className="text-sm tabular-nums">expect {bandText(row, row.mode)}</span>
      <form onSubmit={formSubmit(submit)} className="flex gap-1">
        <input
          aria-label={`Verification reading: ${test}`}
          value={text}
          onChange={(e) => setText(e.target.value)}
          inputMode={row.mode === 'continuity' ? 'text' : 'decimal'}
          autoComplete="off"
          placeholder={row.mode === 'continuity' ? 'beep / no beep' : ''}
          className="min-h-11 w-28 rounded-md border border-stone-500 px-2 font-mono"
        />
        <button type="submit" className="min-h-11 rounded-md bg-board px-3 font-semibold text-white">
          Save
        </button>
      </form>
      <span className="text-sm" data-testid="check-result">
        {latest ? (
          latest.unsent ? (
            <span className="font-semibold text-amber-900">{latest.text} · unsent</span>
          ) : (
            <span className="inline-flex items-center gap-1 font-semibold">
              <MarkerGlyph state={stateOf(latest.verdict)} /> {latest.text} {latest.verdict === 'ok' ? 'healthy' : (latest.verdict ?? '')}
            </span>
          )
        ) : (
          <span className="text-stone-700">not measured</span>
        )}
      </span>
      {error && (
        <p role="alert" className="text-sm text-high sm:col-span-4">
          {error}
        </p>
      )}
    </li>
  );
}

/**
 * Verification as a short checklist (contract: verificationChecklist, the list the sign-off checks): the readings
 * that prove the repaired section, each behind the discharge gate when unpowered on the bus, and the functional
 * check the lead confirms when signing off.
 */
export function VerificationChecklist({ job, readings, canSignOff }: { job: JobDetail; readings: StoredReading[]; canSignOff: boolean }) {
  const view = useMemo(() => boardView(job.board.document), [job.board.document]);
  const words = useMemo(() => boardWords(view.model), [view.model]);
  const { rows, functionalCheck } = useMemo(
    () => verificationChecklist(view.model, job.board.expectedReadings, job.proposedPart),
    [view.model, job.board.expectedReadings, job.proposedPart],
  );
  const sender = useReadingSender(job.id);
  const update = useUpdateJob(job.id);
  const [gateVolts, setGateVolts] = useState<number | null>(null);
  const [gateRefusal, setGateRefusal] = useState<string | null>(null);
  const [functionalDone, setFunctionalDone] = useState(false);
  const repairs = useRepairs(job.id);
  // The same readings the sign-off judges (contract: verificationReadings).
  const current = verificationReadings(readings, repairs.data?.items.at(-1)?.createdAt ?? null);
  const netOf = (p: string) => view.pointOf(p)?.net ?? p;
  const open = unprovenRows(rows, current, netOf);

  const latestOf = (row: ExpectedReadingRow) => {
    const same = (a: { mode: string; red: string; black: string; power: string }) =>
      a.mode === row.mode && a.power === row.power && netOf(a.red) === netOf(row.red) && netOf(a.black) === netOf(row.black);
    const u = [...sender.unsent].reverse().find((x) => x.body.phase === 'verification' && same(x.body));
    if (u) return { text: u.body.raw, verdict: null, unsent: true };
    const r = [...current].reverse().find((x) => same({ ...x, red: x.redNet, black: x.blackNet }));
    return r ? { text: readingText(r), verdict: r.verdict?.verdict ?? null } : undefined;
  };
  const save = async (row: ExpectedReadingRow, text: string) => {
    const p = await parseTyped(text, row.mode);
    if (!p.ok) return p.error;
    const safetyCheck = row.power === 'off' && gateVolts !== null ? { safetyCheck: { unplugged: true as const, busVolts: gateVolts } } : {};
    const refusal = gateRefusalFor(view, { ...row, ...safetyCheck });
    if (refusal) {
      setGateVolts(null);
      setGateRefusal(refusal);
      return 'Pass the discharge gate above first: this reading is unpowered on the DC bus.';
    }
    if (row.power === 'on') setGateVolts(null);
    await sender.save({
      mode: row.mode,
      red: row.red,
      black: row.black,
      power: row.power,
      lifted: row.lifted,
      value: p.value,
      ...(p.beep !== undefined ? { beep: p.beep } : {}),
      raw: text.trim(),
      phase: 'verification',
      ...safetyCheck,
    });
    return null;
  };
  const checkBus = async (t: string): Promise<{ ok: true; volts: number } | { ok: false; message: string }> => {
    const r = await parseTyped(t, 'dcv');
    if (!r.ok) return { ok: false, message: r.error };
    if (r.value === 'OL') return { ok: false, message: 'OL is not a bus voltage: set the meter to DC V and measure again.' };
    return { ok: true, volts: r.value };
  };

  return (
    <section aria-labelledby="verify-h" className="space-y-2 rounded-lg border border-stone-300 bg-white p-3">
      <h2 id="verify-h" className="text-lg font-semibold">
        Verification checklist · {rows.length - open.length} of {rows.length} healthy
      </h2>
      <p className="text-sm text-stone-700">
        The readings that prove the repaired section ({words.designator(job.proposedPart ?? '')}) and the rails feeding it, chosen from the board’s expected
        table.
      </p>
      {gateRefusal && gateVolts === null && (
        <SafetyGate
          figures={gateFigures(view, job.board.expectedReadings)}
          check={checkBus}
          refusal={gateRefusal}
          onPass={(v) => {
            setGateVolts(v);
            setGateRefusal(null);
          }}
        />
      )}
      {sender.rejected.length > 0 && (
        <ul role="alert" className="rounded bg-red-50 p-2 text-sm text-high">
          {sender.rejected.map((r, i) => (
            <li key={i}>
              “{r.raw}” was not stored: {r.message}
            </li>
          ))}
        </ul>
      )}
      <ol>
        {rows.map((row) => (
          <Row key={row.id} row={row} label={words.probe(row.red)} latest={latestOf(row)} onSave={save} />
        ))}
      </ol>
      <div className="space-y-2 border-t border-stone-300 pt-2">
        <label className="flex min-h-11 items-center gap-3">
          <input type="checkbox" className="h-6 w-6" checked={functionalDone} onChange={(e) => setFunctionalDone(e.target.checked)} disabled={!canSignOff} />
          <span>
            <span className="font-semibold">Functional check:</span> {functionalCheck}
          </span>
        </label>
        {job.status === 'repaired' && !canSignOff && (
          <p className="text-sm text-stone-700">A lead signs the repair off once every row is healthy and the functional check is done.</p>
        )}
        {job.status === 'repaired' && canSignOff && (
          <button
            type="button"
            disabled={update.isPending || open.length > 0 || !functionalDone}
            onClick={() => update.mutate({ status: 'verified', functionalCheckDone: true })}
            className="min-h-11 rounded-md bg-ok px-4 font-semibold text-white disabled:opacity-60"
          >
            Sign off: board verified
          </button>
        )}
        {job.status === 'repaired' && canSignOff && open.length > 0 && (
          <p className="text-sm">{open.length} checklist reading(s) still to measure healthy before sign-off.</p>
        )}
        {update.error && (
          <p role="alert" className="text-sm text-high">
            {update.error.message}
          </p>
        )}
      </div>
    </section>
  );
}
