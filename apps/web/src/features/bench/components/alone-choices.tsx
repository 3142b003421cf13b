import type { MeterModeName } from '@splitscope/contract';
import { METER_LABEL } from '@/lib/format';
import type { LiftablePart } from '../lib/use-bench-target';

const MODES: MeterModeName[] = ['ohm', 'diode', 'continuity'];

/**
 * A lifted part on its own pins: the meter function (Ω, diode, continuity: the board is off, so never DC V) and,
 * for a part with more than two pins, which pins the red and black probes are on. The value goes in the reading
 * field below, through the same parser as every reading.
 */
export function AloneChoices({
  part,
  mode,
  red,
  black,
  onChange,
}: {
  part: LiftablePart;
  mode: MeterModeName;
  red: string;
  black: string;
  onChange: (change: { mode?: MeterModeName; red?: string; black?: string }) => void;
}) {
  const name = part.designator;
  const pinSelect = (probe: 'red' | 'black', value: string) => (
    <label className="flex items-center gap-1 text-sm">
      {probe === 'red' ? 'Red on' : 'Black on'}
      <select value={value} onChange={(e) => onChange({ [probe]: e.target.value })} className="min-h-11 rounded-md border border-stone-500 bg-white px-2">
        {part.pins.map((p) => (
          <option key={p.pin} value={p.net}>
            {name} {p.word}
          </option>
        ))}
      </select>
    </label>
  );
  return (
    <fieldset className="flex flex-wrap items-center gap-1 rounded-lg border border-amber-500 bg-amber-50 p-2" data-testid="alone-choices">
      <legend className="px-1 text-sm font-semibold">{name} off the board, measured on its own pins</legend>
      {MODES.map((m) => (
        <button
          key={m}
          type="button"
          aria-pressed={mode === m}
          onClick={() => onChange({ mode: m })}
          className="min-h-11 rounded-md border border-stone-400 bg-white px-3 text-sm aria-pressed:border-copper aria-pressed:bg-amber-100 aria-pressed:font-semibold"
        >
          {METER_LABEL[m]}
        </button>
      ))}
      {part.pins.length > 2 ? (
        <span className="flex flex-wrap gap-2">
          {pinSelect('red', red)}
          {pinSelect('black', black)}
        </span>
      ) : (
        <button type="button" onClick={() => onChange({ red: black, black: red })} className="min-h-11 px-2 text-sm underline">
          swap probes
        </button>
      )}
    </fieldset>
  );
}
