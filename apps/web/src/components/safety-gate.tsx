import { judgeBusVolts } from '@splitscope/contract';
import { useId, useState, type FormEvent } from 'react';
import { Caution } from '@/components/ui/caution';
import { formSubmit } from '@/lib/form-submit';

export interface GateFigures {
  /** Safe threshold in volts and the standard it comes from. */
  thresholdVolts: number;
  thresholdSource: string;
  /** The computed bleed time, already formatted, or null when the board has no bleed path. */
  bleedTime: string | null;
  summary: string;
  cautions: readonly string[];
}

/**
 * Before an unpowered step on a section that touches the bus: the board must be unplugged and a measured bus
 * voltage below the safe threshold entered. `check` parses the typed reading and says whether it passes.
 */
export function SafetyGate({
  figures,
  check,
  onPass,
  refusal,
}: {
  figures: GateFigures;
  check: (text: string) => Promise<{ ok: true; volts: number } | { ok: false; message: string }>;
  onPass: (busVolts: number) => void;
  /** Why the server refused the last reading at the gate, so the technician knows to measure again. */
  refusal?: string | null;
}) {
  const [unplugged, setUnplugged] = useState(false);
  const [text, setText] = useState('');
  const [message, setMessage] = useState<string | null>(refusal ?? null);
  const id = useId();

  const submit = async (e: FormEvent) => {
    e.preventDefault();
    if (!unplugged) return setMessage('Confirm the board is unplugged first.');
    const r = await check(text);
    if (!r.ok) return setMessage(r.message);
    // The contract's rule, the same the server applies: the magnitude counts, a reversed reading is named.
    const judged = judgeBusVolts(r.volts, figures.thresholdVolts);
    if (!judged.ok) return setMessage(judged.message);
    setMessage(null);
    onPass(r.volts);
  };

  return (
    <section aria-labelledby={`${id}-h`} className="space-y-3 rounded-lg border-2 border-high bg-white p-3">
      <h2 id={`${id}-h`} className="text-lg font-semibold">
        Safety gate: discharge the bus before this unpowered step
      </h2>
      <Caution title="The bulk capacitor holds a lethal charge after unplugging">
        <p>{figures.summary}</p>
        <p>
          Bleed time to below {figures.thresholdVolts} V ({figures.thresholdSource}):{' '}
          <strong data-testid="bleed-time">{figures.bleedTime ?? 'no bleed path — discharge it yourself'}</strong>
        </p>
        <ul className="list-disc pl-5">
          {figures.cautions.map((c) => (
            <li key={c}>{c}</li>
          ))}
        </ul>
      </Caution>
      <form onSubmit={formSubmit(submit)} className="space-y-3" noValidate>
        <label className="flex min-h-11 items-center gap-3">
          <input type="checkbox" className="h-6 w-6" checked={unplugged} onChange={(e) => setUnplugged(e.target.checked)} />
          <span>The board is unplugged from mains and I have waited the bleed time</span>
        </label>
        <label className="block">
          <span className="block text-sm font-medium">Bus voltage I measured now (DC volts, across the bulk capacitor)</span>
          <input
            value={text}
            onChange={(e) => setText(e.target.value)}
            inputMode="decimal"
            autoComplete="off"
            className="mt-1 block min-h-11 w-full max-w-xs rounded-md border border-stone-500 px-3 font-mono text-lg"
          />
        </label>
        {message && (
          <p role="alert" className="rounded-md bg-red-50 p-2 text-sm text-high">
            {message}
          </p>
        )}
        <button type="submit" className="min-h-11 rounded-md bg-high px-4 font-semibold text-white">
          Bus is safe — continue
        </button>
      </form>
    </section>
  );
}
