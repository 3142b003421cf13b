import { useState } from 'react';
import type { LiftablePart } from '../lib/use-bench-target';

/**
 * The parts lifted from the board right now: any part can be lifted and put back, and every reading taken
 * meanwhile carries them (the engine computes that board's expected values). A lifted two-pin part's pads can be
 * measured directly, and a lifted part itself on its own pins ("C10 alone").
 */
export function LiftedParts({
  parts,
  lifted,
  onChange,
  onMeasurePads,
  onMeasureAlone,
}: {
  parts: LiftablePart[];
  lifted: string[];
  onChange: (lifted: string[]) => void;
  onMeasurePads: (part: string) => void;
  onMeasureAlone: (part: string) => void;
}) {
  const [pick, setPick] = useState('');
  const label = (id: string) => parts.find((p) => p.id === id)?.label ?? id;
  return (
    <section aria-labelledby="lifted-h" className="rounded-lg border border-stone-300 bg-white p-2">
      <h2 id="lifted-h" className="sr-only">
        Parts lifted
      </h2>
      {lifted.length > 0 && (
        <ul className="mb-1 flex flex-wrap gap-1">
          {lifted.map((p) => (
            <li key={p} className="flex items-center gap-1 rounded-md bg-amber-100 px-2 text-sm">
              <strong>{label(p)}</strong> lifted
              {(parts.find((x) => x.id === p)?.pins.length ?? 0) === 2 && (
                <button type="button" className="min-h-11 px-1 underline" onClick={() => onMeasurePads(p)}>
                  measure its pads
                </button>
              )}
              <button type="button" className="min-h-11 px-1 underline" onClick={() => onMeasureAlone(p)}>
                measure {parts.find((x) => x.id === p)?.designator ?? p} alone
              </button>
              <button type="button" className="min-h-11 px-1 underline" onClick={() => onChange(lifted.filter((x) => x !== p))}>
                put back
              </button>
            </li>
          ))}
        </ul>
      )}
      <form
        className="flex gap-1"
        onSubmit={(e) => {
          e.preventDefault();
          if (pick && !lifted.includes(pick)) onChange([...lifted, pick].sort());
          setPick('');
        }}
      >
        <label className="sr-only" htmlFor="lift-pick">
          Part to lift
        </label>
        <select
          id="lift-pick"
          value={pick}
          onChange={(e) => setPick(e.target.value)}
          className="min-h-11 flex-1 rounded-md border border-stone-500 bg-white px-2 text-sm"
        >
          <option value="">{lifted.length ? 'Lift another part…' : 'Parts lifted: none. Lift a part…'}</option>
          {parts
            .filter((p) => !lifted.includes(p.id))
            .map((p) => (
              <option key={p.id} value={p.id}>
                {p.label}
              </option>
            ))}
        </select>
        <button type="submit" className="min-h-11 rounded-md border border-stone-400 bg-white px-3 text-sm font-semibold">
          Lift
        </button>
      </form>
    </section>
  );
}
