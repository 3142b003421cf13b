import { useEffect, useRef, useState, type FormEvent, type ReactNode } from 'react';
import { Caution } from '@/components/ui/caution';
import { MARKER, type MarkerState } from '@/lib/map-geometry';
import { MarkerGlyph } from '@/components/board-map/marker-glyph';
import { METER_LABEL } from '@/lib/format';
import { formSubmit } from '@/lib/form-submit';

export interface ReadingTarget {
  pointId: string;
  pointLabel: string;
  meter: string;
  power: 'on' | 'off';
  red: { label: string };
  black: { label: string };
  /** What the engine computed for this test on a healthy board. */
  /** `note` says why an in-circuit reading differs from a part's own value (parallel paths). */
  /** `assumes` names the meter the value was computed for (a sourced band stands whatever the meter). */
  expected?: { text: string; band: string; note?: string; source?: string; assumes?: string } | null;
  touchesBus?: boolean;
  /** Parts lifted for this reading, by designator. */
  lifted?: string[];
}

export interface LatestReading {
  text: string;
  state: MarkerState | 'unsent';
  detail?: string;
}

/**
 * Where the probes go, what the engine expects, and a keyboard-first value field: type "14.9", "2.2k" or "OL"
 * and press Enter. The verdict shown is the server's (the diagnosis engine's), never worked out here.
 */
export function ReadingPanel({
  target,
  latest,
  onSave,
  error,
  busy,
  meter,
}: {
  target: ReadingTarget;
  latest?: LatestReading | null;
  onSave: (text: string) => Promise<boolean> | boolean;
  error?: string | null;
  busy?: boolean;
  /** The bench meter's controls: the reading taken by the meter's trigger instead of typed. */
  meter?: ReactNode;
}) {
  const [text, setText] = useState('');
  const field = useRef<HTMLInputElement>(null);
  useEffect(() => {
    setText('');
    field.current?.focus();
  }, [target.pointId, target.meter]);

  const submit = async (e: FormEvent) => {
    e.preventDefault();
    if (!text.trim()) return;
    if (await onSave(text)) setText('');
  };

  const continuity = target.meter === 'continuity';
  // Continuity is a beep or none: b and n answer it from the keyboard, the buttons from a glove.
  const quick = async (answer: 'beep' | 'no beep') => {
    if (await onSave(answer)) setText('');
  };
  return (
    <section aria-labelledby="reading-h" className="space-y-2 rounded-lg border border-stone-300 bg-white p-3">
      <h2 id="reading-h" className="text-base font-semibold">
        {METER_LABEL[target.meter] ?? target.meter} at {target.pointLabel}
      </h2>
      <p className="text-sm" data-testid="probe-line">
        <span className="mr-1 inline-block h-3 w-3 rounded-full bg-[#c81e1e] align-middle" aria-hidden /> red on <strong>{target.red.label}</strong> ·{' '}
        <span className="mr-1 inline-block h-3 w-3 rounded-full bg-[#111827] align-middle" aria-hidden /> black on <strong>{target.black.label}</strong> · board{' '}
        <strong>{target.power === 'on' ? 'POWERED' : 'UNPLUGGED, bus discharged'}</strong>
        {target.lifted && target.lifted.length > 0 && (
          <>
            {' '}
            · <strong data-testid="lifted-line">{target.lifted.join(', ')} lifted</strong>
          </>
        )}
      </p>
      <form onSubmit={formSubmit(submit)} className="flex flex-wrap items-end gap-2">
        <label className="min-w-0 flex-1">
          <span className="block text-sm font-medium">Measured value</span>
          <input
            ref={field}
            value={text}
            onChange={(e) => setText(e.target.value)}
            inputMode={continuity ? 'text' : 'decimal'}
            autoComplete="off"
            spellCheck={false}
            placeholder={continuity ? 'b = beep, n = no beep' : 'e.g. 14.9, 2.2k, OL'}
            aria-describedby="reading-hint"
            className="mt-1 block min-h-11 w-full rounded-md border border-stone-500 px-3 font-mono text-lg"
          />
        </label>
        <button type="submit" disabled={busy} className="min-h-11 rounded-md bg-board px-4 font-semibold text-white disabled:opacity-60">
          Save
        </button>
        {continuity && (
          <span className="flex gap-2">
            <button type="button" onClick={() => void quick('beep')} className="min-h-11 rounded-md border-2 border-board bg-white px-3 font-semibold">
              Beep
            </button>
            <button type="button" onClick={() => void quick('no beep')} className="min-h-11 rounded-md border-2 border-board bg-white px-3 font-semibold">
              No beep
            </button>
          </span>
        )}
        <p id="reading-hint" className="w-full text-xs text-stone-700">
          {continuity ? 'Type b or n and press Enter, or tap Beep / No beep.' : 'Enter saves. Prefixes k, M, m, u and codes like 4k7 work; OL for overload.'}
        </p>
      </form>
      {meter}
      {error && (
        <p role="alert" className="rounded-md bg-red-50 p-2 text-sm text-high">
          {error}
        </p>
      )}
      <div aria-live="polite" className="min-h-7">
        {latest && (
          <p className="flex flex-wrap items-center gap-2 text-base" data-testid="verdict">
            {latest.state === 'unsent' ? (
              <span className="rounded bg-amber-100 px-2 py-0.5 text-sm font-semibold text-amber-950">UNSENT</span>
            ) : (
              <MarkerGlyph state={latest.state} />
            )}
            <span className="font-mono font-semibold">{latest.text}</span>
            <span className="font-semibold">{latest.state === 'unsent' ? 'kept on this device, will be sent' : MARKER[latest.state].label}</span>
            {latest.detail && <span className="text-sm text-stone-700">{latest.detail}</span>}
          </p>
        )}
      </div>
      <dl className="grid grid-cols-[auto_1fr] gap-x-3 text-sm">
        <dt className="text-stone-700">Expected</dt>
        <dd className="font-semibold" data-testid="expected-band">
          {target.expected ? target.expected.band : 'computed by the engine when the reading is saved'}
        </dd>
        {target.expected?.note && (
          <>
            <dt className="text-stone-700">In circuit</dt>
            <dd data-testid="expected-note">{target.expected.note}</dd>
          </>
        )}
        {target.expected?.assumes && !target.expected.source && (
          <>
            <dt className="text-stone-700">For meter</dt>
            <dd data-testid="expected-meter">{target.expected.assumes}</dd>
          </>
        )}
        {target.expected?.source && (
          <>
            <dt className="text-stone-700">Band from</dt>
            <dd className="line-clamp-2 text-xs" title={target.expected.source}>
              {target.expected.source}
            </dd>
          </>
        )}
      </dl>
      {target.power === 'on' && (
        <Caution title="Powered board: mains and ~300 V DC bus present">
          <p className="text-sm">One hand, insulated probes, a meter rated for the bus; your shop’s procedures and local codes.</p>
        </Caution>
      )}
    </section>
  );
}
