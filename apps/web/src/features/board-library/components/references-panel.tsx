import { useState } from 'react';
import type { BoardDetail, ReferenceBand } from '@splitscope/contract';
import { parseTyped } from '@/lib/parse-reading';
import { METER_LABEL, meterText } from '@/lib/format';
import { useRecordReference, useReferences } from '../api/references';

const bandText = (b: { low: number; high: number } | null, unit: ReferenceBand['unit']) => (b ? `${meterText(b.low, unit)} – ${meterText(b.high, unit)}` : '—');

/**
 * Known-good references of a board model: each point's expected band from its three sources, labelled, with the
 * points where the model and the good boards (or a published band) disagree flagged for review; and a form that
 * records a known-good board's readings.
 */
export function ReferencesPanel({ board, canRecord }: { board: BoardDetail; canRecord: boolean }) {
  const refs = useReferences(board.id);
  const record = useRecordReference(board.id);
  const rows = board.expectedReadings.filter((r) => r.lifted.length === 0 && r.mode !== 'continuity');
  const [values, setValues] = useState<Record<string, string>>({});
  const [serial, setSerial] = useState('');
  const [error, setError] = useState<string | null>(null);
  const bands = refs.data?.bands ?? [];
  const flagged = bands.filter((b) => b.review);

  // Values are parsed the way the bench's reading field parses them ("4k7", "OL", "14.9").
  const submit = async () => {
    setError(null);
    const readings = [];
    for (const r of rows) {
      const raw = values[r.id]?.trim();
      if (!raw) continue;
      const parsed = await parseTyped(raw, r.mode);
      if (!parsed.ok) return setError(`${r.label ?? r.id} (${METER_LABEL[r.mode]}): ${parsed.error}`);
      readings.push({ mode: r.mode, red: r.red, black: r.black, power: r.power, value: parsed.value });
    }
    if (readings.length === 0) return setError('Type at least one reading of the good board.');
    record.mutate({ serial: serial || null, readings }, { onSuccess: () => setValues({}), onError: (e) => setError(e.message) });
  };

  return (
    <section aria-labelledby="refs-h" className="space-y-2">
      <h2 id="refs-h" className="text-lg font-semibold">
        Known-good references
      </h2>
      <p className="text-sm text-stone-700">
        {refs.data
          ? `${refs.data.sets.length} known-good board${refs.data.sets.length === 1 ? '' : 's'} recorded`
          : refs.isError
            ? `The references could not be loaded: ${refs.error.message}`
            : 'Loading…'}
        {refs.data?.sets.length
          ? `: ${refs.data.sets.map((s) => (s.origin === 'verification' ? `job #${s.jobNumber} after repair` : (s.serial ?? 'a good board'))).join(', ')}`
          : ''}
        .
      </p>
      {flagged.length > 0 && (
        <div role="alert" className="rounded-md border border-amber-600 bg-amber-50 p-2 text-sm" data-testid="reference-flags">
          <p className="font-semibold">
            Check the model at {flagged.length} point{flagged.length === 1 ? '' : 's'}:
          </p>
          <ul className="list-disc pl-5">
            {flagged.map((b) => (
              <li key={`${b.mode}-${b.power}-${b.red}-${b.black}`}>
                <strong>
                  {b.label}, {METER_LABEL[b.mode]}
                </strong>
                : {b.review}
              </li>
            ))}
          </ul>
        </div>
      )}
      {bands.length > 0 && (
        <div className="overflow-x-auto rounded-lg border border-stone-300 bg-white">
          <table className="w-full text-left text-sm">
            <thead className="bg-stone-100">
              <tr>
                <th className="p-1">Point</th>
                <th>Meter</th>
                <th>Computed from the model</th>
                <th>Measured on known-good boards</th>
                <th>Published</th>
              </tr>
            </thead>
            <tbody>
              {bands.map((b) => (
                <tr key={`${b.mode}-${b.power}-${b.red}-${b.black}`} className={`border-t border-stone-200 ${b.review ? 'bg-amber-50' : ''}`}>
                  <td className="p-1 font-semibold">{b.label}</td>
                  <td>
                    {METER_LABEL[b.mode]}, {b.power === 'on' ? 'powered' : 'unplugged'}
                  </td>
                  <td className="tabular-nums">{b.model ? `${meterText(b.model.expected, b.unit)} (${bandText(b.model, b.unit)})` : 'no value'}</td>
                  <td className="tabular-nums">
                    {b.measured
                      ? `median ${meterText(b.measured.median, b.unit)} ± ${meterText(b.measured.spread, b.unit)} (${bandText(b.measured, b.unit)}), ${b.measured.boards} board${b.measured.boards === 1 ? '' : 's'}`
                      : '—'}
                  </td>
                  <td className="max-w-xs text-xs">{b.published ? `${bandText(b.published, b.unit)} — ${b.published.source}` : '—'}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
      {canRecord && (
        <details className="rounded-md border border-stone-300 bg-white p-2">
          <summary className="cursor-pointer font-semibold">Record a known-good board</summary>
          <p className="mt-1 text-sm">
            Type what the good board reads; leave a point empty to skip it. Unplug the board and discharge the bus before any unpowered reading.
          </p>
          <label className="mt-2 block text-sm">
            Board serial
            <input className="ml-2 min-h-11 rounded-md border border-stone-500 px-2" value={serial} onChange={(e) => setSerial(e.target.value)} />
          </label>
          <div className="mt-2 grid gap-1 sm:grid-cols-2">
            {rows.map((r) => (
              <label key={r.id} className="flex items-center justify-between gap-2 text-sm">
                <span>
                  {r.label ?? r.red} · {METER_LABEL[r.mode]} · {r.power === 'on' ? 'powered' : 'unplugged'}
                </span>
                <input
                  aria-label={`${r.label ?? r.red} ${METER_LABEL[r.mode]} ${r.power === 'on' ? 'powered' : 'unplugged'}`}
                  className="min-h-11 w-28 rounded-md border border-stone-500 px-2"
                  value={values[r.id] ?? ''}
                  onChange={(e) => setValues({ ...values, [r.id]: e.target.value })}
                />
              </label>
            ))}
          </div>
          {error && (
            <p role="alert" className="mt-2 rounded-md bg-red-50 p-2 text-sm text-high">
              {error}
            </p>
          )}
          <button
            type="button"
            onClick={() => void submit()}
            disabled={record.isPending}
            className="mt-2 min-h-11 rounded-md bg-board px-4 font-semibold text-white"
          >
            {record.isPending ? 'Saving…' : 'Save as a known-good reference'}
          </button>
        </details>
      )}
    </section>
  );
}
