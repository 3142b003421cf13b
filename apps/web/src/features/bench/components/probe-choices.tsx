import type { ExpectedReadingRow } from '@splitscope/contract';
import { METER_LABEL } from '@/lib/format';

/**
 * The tests the expected table holds at the chosen point. The point is already chosen: what tells these apart is
 * the meter function and the power state.
 */
export function ProbeChoices({
  rows,
  isChosen,
  onChoose,
}: {
  rows: ExpectedReadingRow[];
  isChosen: (r: ExpectedReadingRow) => boolean;
  onChoose: (r: ExpectedReadingRow) => void;
}) {
  if (rows.length < 2) return null;
  return (
    <fieldset className="flex flex-wrap gap-1">
      <legend className="text-sm font-medium">Test at this point</legend>
      {rows.map((r) => (
        <button
          key={r.id}
          type="button"
          aria-pressed={isChosen(r)}
          onClick={() => onChoose(r)}
          className="min-h-11 rounded-md border border-stone-400 bg-white px-2 text-sm aria-pressed:border-copper aria-pressed:bg-amber-50 aria-pressed:font-semibold"
        >
          {METER_LABEL[r.mode]} · {r.power === 'on' ? 'powered' : 'unplugged'}
        </button>
      ))}
    </fieldset>
  );
}
