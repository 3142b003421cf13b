import { busSafety, decodeColourBands, decodeSmdCode, nearestPreferred, SAFE_THRESHOLDS, type SafeThresholdId } from '@splitscope/boards/references';
import { parseReadingInput } from '@splitscope/boards/units';
import { useState } from 'react';
import { Caution } from '@/components/ui/caution';
import { PageHeader } from '@/components/ui/page-header';
import { meterText } from '@/lib/format';

const field = 'mt-1 block min-h-11 w-full rounded-md border border-stone-500 bg-white px-3 font-mono';

const FIELD_WORDS = { V: 'The bus voltage', ohm: 'The bleeder resistance', F: 'The bulk capacitance' } as const;
const EXAMPLE = { V: '340', ohm: '220k', F: '680u' } as const;

/** One field of the calculator: a positive value with its unit, or a sentence saying what to type instead. */
function parse(text: string, unit: 'V' | 'ohm' | 'F', required: boolean): { value?: number; error?: string } {
  const what = FIELD_WORDS[unit];
  if (!text.trim()) return required ? { error: `${what} is needed, e.g. ${EXAMPLE[unit]}.` } : {};
  const r = parseReadingInput(text, unit);
  if (!r.ok) return { error: `${what}: “${text.trim()}” is not a number. Type a number with an optional prefix, e.g. ${EXAMPLE[unit]}.` };
  if (r.value === 'OL') return { error: `${what}: OL is a meter overload, not a value. Type a number, e.g. ${EXAMPLE[unit]}.` };
  if (r.value < 0)
    return {
      error:
        unit === 'V'
          ? `The bus voltage is entered as a magnitude: a meter reading of ${text.trim()} means the probes were reversed. Type ${String(-r.value)} to work out the bleed time.`
          : `${what} cannot be negative.`,
    };
  if (r.value === 0) return { error: `${what} must be more than zero.` };
  return { value: r.value };
}

function BusCalculator() {
  const [c, setC] = useState('680u');
  const [r, setR] = useState('220k');
  const [v, setV] = useState('340');
  const [t, setT] = useState<SafeThresholdId>('selv-60vdc');
  const cap = parse(c, 'F', true);
  const bleeder = parse(r, 'ohm', false);
  const volts = parse(v, 'V', true);
  let result: ReturnType<typeof busSafety> | null = null;
  let error = cap.error ?? bleeder.error ?? volts.error ?? null;
  const threshold = SAFE_THRESHOLDS[t];
  // Below the threshold there is nothing to wait for: say so instead of a bleed time of "0.00 ms".
  const alreadySafe = volts.value !== undefined && volts.value < threshold.volts;
  if (!error && cap.value && volts.value) {
    try {
      result = busSafety({ capacitanceF: cap.value, bleederOhms: bleeder.value, busVolts: volts.value, threshold: SAFE_THRESHOLDS[t] });
    } catch (e) {
      error = (e as Error).message;
    }
  }
  return (
    <section aria-labelledby="bus-h" className="space-y-3 rounded-lg border border-stone-300 bg-white p-4">
      <h2 id="bus-h" className="text-lg font-semibold">
        Bus-safety calculator
      </h2>
      <div className="grid gap-3 sm:grid-cols-2">
        <label>
          <span className="text-sm font-medium">Bulk capacitance</span>
          <input className={field} value={c} onChange={(e) => setC(e.target.value)} />
        </label>
        <label>
          <span className="text-sm font-medium">Bleeder resistance (empty if none)</span>
          <input className={field} value={r} onChange={(e) => setR(e.target.value)} />
        </label>
        <label>
          <span className="text-sm font-medium">Bus voltage at unplugging (V)</span>
          <input className={field} value={v} onChange={(e) => setV(e.target.value)} />
        </label>
        <label>
          <span className="text-sm font-medium">Safe threshold</span>
          <select className={`${field} font-sans`} value={t} onChange={(e) => setT(e.target.value as SafeThresholdId)}>
            {Object.values(SAFE_THRESHOLDS).map((s) => (
              <option key={s.id} value={s.id}>
                {s.volts} V — {s.standard}
              </option>
            ))}
          </select>
        </label>
      </div>
      <div aria-live="polite">
        {error && (
          <p role="alert" className="text-high">
            {error}
          </p>
        )}
        {result && (
          <div className="space-y-2">
            <dl className="grid grid-cols-[12rem_1fr] gap-y-1">
              <dt>Stored energy</dt>
              <dd className="font-semibold tabular-nums">{result.energyJ.toPrecision(3)} J</dd>
              <dt>Time constant</dt>
              <dd className="font-semibold tabular-nums">{result.tauS === null ? 'no bleed path' : `${result.tauS.toPrecision(3)} s`}</dd>
              <dt>Bleed time to {result.threshold.volts} V</dt>
              <dd className="font-semibold tabular-nums" data-testid="calc-bleed">
                {alreadySafe
                  ? 'no wait: already below the threshold'
                  : result.bleedTimeS === null
                    ? 'never by itself — discharge it'
                    : `${result.bleedTimeS.toPrecision(3)} s`}
              </dd>
            </dl>
            <p className="text-sm" data-testid="calc-summary">
              {alreadySafe
                ? `${volts.value} V is already below the ${threshold.volts} V threshold (${threshold.standard}), so there is no bleed time to wait. The capacitor still holds ${result.energyJ.toPrecision(3)} J: measure the bus across the bulk capacitor before touching, as the voltage you typed may not be what the board holds now.`
                : result.summary}
            </p>
            <p className="text-xs text-stone-700">
              Threshold: {result.threshold.clause}. {result.threshold.note}
            </p>
          </div>
        )}
      </div>
    </section>
  );
}

function MarkingDecoder() {
  const [bands, setBands] = useState('brown black orange gold');
  const [smd, setSmd] = useState('4R7');
  const decode = <T,>(f: () => T): { ok: T } | { err: string } => {
    try {
      return { ok: f() };
    } catch (e) {
      return { err: (e as Error).message };
    }
  };
  const b = bands.trim() ? decode(() => decodeColourBands(bands)) : null;
  const s = smd.trim() ? decode(() => decodeSmdCode(smd)) : null;
  return (
    <section aria-labelledby="mark-h" className="space-y-3 rounded-lg border border-stone-300 bg-white p-4">
      <h2 id="mark-h" className="text-lg font-semibold">
        Marking decoder
      </h2>
      <label className="block">
        <span className="text-sm font-medium">Colour bands (IEC 60062), first band first</span>
        <input className={field} value={bands} onChange={(e) => setBands(e.target.value)} />
      </label>
      <p aria-live="polite" data-testid="bands-result">
        {b &&
          ('ok' in b ? (
            <>
              <strong>{meterText(b.ok.ohms, 'ohm')}</strong> ±{(b.ok.tolerance * 100).toFixed(b.ok.tolerance < 0.01 ? 2 : 0)} %
              {b.ok.tempcoPpmK ? `, ${b.ok.tempcoPpmK} ppm/K` : ''} · nearest E24 value {meterText(nearestPreferred(b.ok.ohms, 'E24').value, 'ohm')}
            </>
          ) : (
            <span className="text-high">{b.err}</span>
          ))}
      </p>
      <label className="block">
        <span className="text-sm font-medium">SMD resistor code (3-digit, 4-digit, R-notation, EIA-96)</span>
        <input className={field} value={smd} onChange={(e) => setSmd(e.target.value)} />
      </label>
      <p aria-live="polite" data-testid="smd-result">
        {s &&
          ('ok' in s ? (
            <>
              <strong>{meterText(s.ok.ohms, 'ohm')}</strong> · {s.ok.system} code, usually ±{(s.ok.typicalTolerance * 100).toFixed(0)} %
            </>
          ) : (
            <span className="text-high">{s.err}</span>
          ))}
      </p>
    </section>
  );
}

function ReferencesPage() {
  return (
    <div className="space-y-4">
      <PageHeader title="Bench references" />
      <Caution title="These figures are a bench aid, not a safety device">
        <p>Always measure the bus before touching. Follow your shop’s procedures, local electrical codes and licensed practice.</p>
      </Caution>
      <div className="grid gap-4 lg:grid-cols-2">
        <BusCalculator />
        <MarkingDecoder />
      </div>
    </div>
  );
}

export default ReferencesPage;
