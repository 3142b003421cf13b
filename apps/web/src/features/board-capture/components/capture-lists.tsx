import type { BoardCapture, BoardDraft } from '@splitscope/contract';
import { bandText, meterText, METER_LABEL } from '@/lib/format';

const input = 'min-h-11 min-w-0 rounded-md border border-stone-500 bg-white px-2';

/**
 * The test points placed on the photo: a label, the net each sits on (a net a section models gets expected
 * values when the draft is saved), and what the engine computed for it.
 */
export function PointList({
  capture,
  draft,
  nets,
  readOnly,
  onChange,
}: {
  capture: BoardCapture;
  draft: BoardDraft | undefined;
  nets: BoardDraft['nets'];
  readOnly: boolean;
  onChange: (c: BoardCapture) => void;
}) {
  const set = (i: number, patch: Partial<BoardCapture['points'][number]>) =>
    onChange({ ...capture, points: capture.points.map((p, j) => (j === i ? { ...p, ...patch } : p)) });
  return (
    <section aria-labelledby="points-h" className="space-y-2">
      <h2 id="points-h" className="text-lg font-semibold">
        Test points ({capture.points.length})
      </h2>
      {capture.points.length === 0 && <p className="text-sm">Choose “Place test point” and click the photo where the probe goes.</p>}
      <datalist id="capture-nets">
        {nets.map((n) => (
          <option key={n.name} value={n.name}>
            {n.label}
          </option>
        ))}
      </datalist>
      <ul className="space-y-2">
        {capture.points.map((p, i) => {
          const result = draft?.points.find((r) => r.id === p.id);
          return (
            <li key={p.id} className="rounded-md border border-stone-300 p-2 text-sm" data-testid={`point-${p.id}`}>
              <div className="flex flex-wrap items-end gap-2">
                <span className="font-semibold">{p.id}</span>
                <label className="flex min-w-0 flex-1 flex-col">
                  Label
                  <input className={input} value={p.label} readOnly={readOnly} onChange={(e) => set(i, { label: e.target.value })} />
                </label>
                <label className="flex min-w-0 flex-1 flex-col">
                  Net
                  <input
                    className={input}
                    list="capture-nets"
                    value={p.net ?? ''}
                    readOnly={readOnly}
                    placeholder="e.g. v15"
                    onChange={(e) => set(i, e.target.value.trim() ? { net: e.target.value.trim() } : { net: undefined })}
                  />
                </label>
                {!readOnly && (
                  <button
                    type="button"
                    className="min-h-11 px-2 text-red-800 underline"
                    onClick={() => onChange({ ...capture, points: capture.points.filter((_, j) => j !== i) })}
                  >
                    Remove {p.id}
                  </button>
                )}
              </div>
              {result && result.expected.length > 0 && (
                <ul className="mt-1 text-stone-800" aria-label={`Expected at ${p.id}`}>
                  {result.expected.map((e) => (
                    <li key={`${e.mode}-${e.power}`}>
                      {METER_LABEL[e.mode] ?? e.mode}, {e.power === 'on' ? 'powered' : 'unplugged'}: <strong>{meterText(e.expected, e.unit)}</strong>
                      {e.low !== null && e.high !== null ? ` (healthy ${bandText(e, e.mode)})` : ''}
                      {e.source ? <span className="text-stone-600"> — {e.source}</span> : ' — computed from the model'}
                    </li>
                  ))}
                </ul>
              )}
              {result?.unmodelled && <p className="mt-1 text-stone-700">No expected value: {result.unmodelled}.</p>}
            </li>
          );
        })}
      </ul>
    </section>
  );
}

/** Connectors placed on the photo, each with its pins (pin, net, what it carries). */
export function ConnectorList({ capture, readOnly, onChange }: { capture: BoardCapture; readOnly: boolean; onChange: (c: BoardCapture) => void }) {
  const setC = (i: number, c: BoardCapture['connectors'][number]) => onChange({ ...capture, connectors: capture.connectors.map((x, j) => (j === i ? c : x)) });
  return (
    <section aria-labelledby="connectors-h" className="space-y-2">
      <h2 id="connectors-h" className="text-lg font-semibold">
        Connectors ({capture.connectors.length})
      </h2>
      {capture.connectors.map((c, i) => (
        <fieldset key={i} className="space-y-1 rounded-md border border-stone-300 p-2 text-sm">
          <legend className="px-1 font-semibold">{c.name}</legend>
          <label className="flex flex-col">
            Name as printed
            <input className={input} value={c.name} readOnly={readOnly} onChange={(e) => setC(i, { ...c, name: e.target.value.toUpperCase() })} />
          </label>
          <ul className="space-y-1">
            {c.pins.map((pin, k) => {
              const setPin = (patch: Partial<typeof pin>) => setC(i, { ...c, pins: c.pins.map((x, m) => (m === k ? { ...x, ...patch } : x)) });
              return (
                <li key={k} className="grid grid-cols-[3.5rem_1fr_1fr] gap-1">
                  <input aria-label={`${c.name} pin`} className={input} value={pin.pin} readOnly={readOnly} onChange={(e) => setPin({ pin: e.target.value })} />
                  <input
                    aria-label={`${c.name} pin ${pin.pin} net`}
                    className={input}
                    list="capture-nets"
                    value={pin.net}
                    readOnly={readOnly}
                    placeholder="net"
                    onChange={(e) => setPin({ net: e.target.value.trim() })}
                  />
                  <input
                    aria-label={`${c.name} pin ${pin.pin} function`}
                    className={input}
                    value={pin.function}
                    readOnly={readOnly}
                    placeholder="e.g. 15 V to the motor"
                    onChange={(e) => setPin({ function: e.target.value })}
                  />
                </li>
              );
            })}
          </ul>
          {!readOnly && (
            <div className="flex gap-2">
              <button
                type="button"
                className="min-h-11 underline"
                onClick={() => setC(i, { ...c, pins: [...c.pins, { pin: String(c.pins.length + 1), net: '', function: '' }] })}
              >
                Add pin
              </button>
              <button
                type="button"
                className="min-h-11 text-red-800 underline"
                onClick={() => onChange({ ...capture, connectors: capture.connectors.filter((_, j) => j !== i) })}
              >
                Remove {c.name}
              </button>
            </div>
          )}
        </fieldset>
      ))}
    </section>
  );
}
