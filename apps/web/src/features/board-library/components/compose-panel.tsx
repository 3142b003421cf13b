import type { BoardModel } from '@splitscope/contract';
import { useState } from 'react';

// The spec as the board library's composeBoard takes it; typed loosely here because the document stores it as
// plain JSON and the library validates it when composing.
interface Section {
  id: string;
  title?: string;
  template?: string;
  base?: number;
  nets?: Record<string, string>;
  params?: Record<string, number | string | boolean>;
  spice?: string;
  region: { x: number; y: number; w: number; h: number };
}
type Spec = Record<string, unknown> & { sections: Section[]; height: number; width: number };

const input = 'min-h-11 rounded-md border border-stone-500 bg-white px-2';
const bindingsText = (nets: Record<string, string> = {}) =>
  Object.entries(nets)
    .map(([k, v]) => `${k}=${v}`)
    .join(' ');
const parseBindings = (text: string) =>
  Object.fromEntries(
    text
      .split(/\s+/)
      .filter(Boolean)
      .map((kv) => kv.split('=') as [string, string])
      .filter(([k, v]) => k && v),
  );
const paramValue = (old: unknown, text: string) =>
  typeof old === 'number' && text.trim() !== '' && Number.isFinite(Number(text)) ? Number(text) : typeof old === 'boolean' ? text === 'true' : text;

/**
 * Compose from section templates: change a section's parameters, port nets or SPICE lines, add a template
 * section, and compose the board again in the browser (the board library's composeBoard). Saving sends the
 * result to the server, which checks the netlist and recomputes the expected readings.
 */
export function ComposePanel({
  composition,
  canEdit,
  onComposed,
}: {
  composition: Record<string, unknown>;
  canEdit: boolean;
  onComposed: (doc: BoardModel, drawingUrl: string) => void;
}) {
  const [spec, setSpec] = useState<Spec>(() => structuredClone(composition) as Spec);
  const [templates, setTemplates] = useState<string[] | null>(null);
  const [adding, setAdding] = useState('');
  const [message, setMessage] = useState<{ ok: boolean; text: string } | null>(null);
  const setSection = (i: number, s: Section) => setSpec({ ...spec, sections: spec.sections.map((x, j) => (j === i ? s : x)) });
  // The library (with its demo boards) is loaded only when someone composes, to keep it out of the first load.
  const library = () => import('@splitscope/boards');

  const compose = async () => {
    const { composeBoard, drawBoard } = await library();
    try {
      onComposed(composeBoard(spec as never), `data:image/svg+xml;charset=utf-8,${encodeURIComponent(drawBoard(spec as never))}`);
      setMessage({
        ok: true,
        text: 'Composed: netlist, parts, nets, test points and picture replaced. Save to have the server check it and recompute the expected readings.',
      });
    } catch (err) {
      setMessage({ ok: false, text: (err as Error).message });
    }
  };
  const add = () => {
    if (!adding) return;
    const bottom = Math.max(0, ...spec.sections.map((s) => s.region.y + s.region.h));
    const base = Math.max(0, ...spec.sections.map((s) => s.base ?? 0)) + 100;
    const region = { x: 40, y: bottom + 20, w: Math.min(600, spec.width - 80), h: 240 };
    setSpec({
      ...spec,
      height: Math.max(spec.height, region.y + region.h + 120),
      sections: [...spec.sections, { id: `${adding}-${base}`, template: adding, base, nets: {}, params: {}, region }],
    });
    setAdding('');
  };

  return (
    <section aria-labelledby="compose-h" className="space-y-2 rounded-lg border border-stone-300 bg-white p-3">
      <h2 id="compose-h" className="text-lg font-semibold">
        Compose from section templates
      </h2>
      <ol className="space-y-2">
        {spec.sections.map((s, i) => (
          <li key={s.id} className="space-y-1 rounded-md border border-stone-200 p-2">
            <div className="flex flex-wrap items-center justify-between gap-2">
              <p className="font-semibold">
                {s.title ?? s.id}{' '}
                <span className="font-normal text-stone-700">· {s.template ? `template ${s.template}, designators from ${s.base}` : 'SPICE lines'}</span>
              </p>
              {canEdit && (
                <button
                  type="button"
                  className="min-h-11 rounded-md border border-stone-400 px-3 text-sm"
                  onClick={() => setSpec({ ...spec, sections: spec.sections.filter((_, j) => j !== i) })}
                >
                  Remove {s.id}
                </button>
              )}
            </div>
            {s.template ? (
              <div className="flex flex-wrap gap-2">
                <label className="text-sm">
                  <span className="block">Port nets (port=net)</span>
                  <input
                    className={`${input} w-72 font-mono`}
                    disabled={!canEdit}
                    defaultValue={bindingsText(s.nets)}
                    onBlur={(e) => setSection(i, { ...s, nets: parseBindings(e.target.value) })}
                  />
                </label>
                {Object.entries(s.params ?? {}).map(([k, v]) => (
                  <label key={k} className="text-sm">
                    <span className="block">{k}</span>
                    <input
                      className={`${input} w-28 font-mono`}
                      disabled={!canEdit}
                      defaultValue={String(v)}
                      onBlur={(e) => setSection(i, { ...s, params: { ...s.params, [k]: paramValue(v, e.target.value) } })}
                    />
                  </label>
                ))}
              </div>
            ) : (
              <textarea
                aria-label={`SPICE lines of ${s.id}`}
                className="block w-full rounded-md border border-stone-500 p-2 font-mono text-xs"
                rows={4}
                spellCheck={false}
                readOnly={!canEdit}
                defaultValue={s.spice}
                onBlur={(e) => setSection(i, { ...s, spice: e.target.value })}
              />
            )}
          </li>
        ))}
      </ol>
      {canEdit && (
        <div className="flex flex-wrap items-end gap-2">
          <label className="text-sm">
            <span className="block">Add a section from a template</span>
            <select
              className={input}
              value={adding}
              onFocus={() => void library().then((m) => setTemplates(Object.keys(m.TEMPLATES)))}
              onChange={(e) => setAdding(e.target.value)}
            >
              <option value="">Choose a template…</option>
              {(templates ?? []).map((t) => (
                <option key={t} value={t}>
                  {t}
                </option>
              ))}
            </select>
          </label>
          <button type="button" className="min-h-11 rounded-md border border-stone-400 bg-white px-3 font-semibold" onClick={add} disabled={!adding}>
            Add
          </button>
          <button type="button" className="min-h-11 rounded-md bg-board px-4 font-semibold text-white" onClick={() => void compose()}>
            Compose the board again
          </button>
        </div>
      )}
      {message && (
        <p role={message.ok ? 'status' : 'alert'} className={`rounded-md p-2 text-sm ${message.ok ? 'bg-green-50 text-ok' : 'bg-red-50 text-high'}`}>
          {message.text}
        </p>
      )}
    </section>
  );
}
