import { decodeMarking, formatSi, MarkingError, TEMPLATE_INFO, TEMPLATES, type MarkedKind } from '@splitscope/boards';
import type { CaptureSection } from '@splitscope/contract';
import { useMemo, useState } from 'react';

const input = 'min-h-11 rounded-md border border-stone-500 bg-white px-2';
const MARKED: MarkedKind[] = ['resistor', 'ceramic-capacitor', 'electrolytic-capacitor'];
const HINT: Record<MarkedKind, string> = {
  resistor: 'colour bands or SMD code, e.g. brown black orange gold, 103, 01C',
  'ceramic-capacitor': 'code, e.g. 104, 473J',
  'electrolytic-capacitor': 'sleeve, e.g. 470µF 400V',
};

/** One part value: what is printed on it, decoded as the part's kind, or why it cannot be read. */
function PartValue({
  designator,
  kind,
  preset,
  marking,
  onValue,
}: {
  designator: string;
  kind: MarkedKind;
  preset: string;
  marking: string;
  onValue: (marking: string, value: number | null) => void;
}) {
  const [text, setText] = useState(marking);
  const decoded = useMemo(() => {
    if (!text.trim()) return null;
    try {
      return { ok: true as const, d: decodeMarking(kind, text) };
    } catch (err) {
      if (err instanceof MarkingError) return { ok: false as const, message: err.message };
      throw err;
    }
  }, [kind, text]);
  return (
    <li className="grid grid-cols-[4.5rem_1fr] items-center gap-x-2 gap-y-0.5">
      <label htmlFor={`mk-${designator}`} className="font-semibold">
        {designator}
      </label>
      <input
        id={`mk-${designator}`}
        className={input}
        value={text}
        placeholder={`${preset} · ${HINT[kind]}`}
        onChange={(e) => setText(e.target.value)}
        onBlur={() => onValue(text.trim(), decoded?.ok ? decoded.d.nominal : null)}
      />
      <span />
      <span className="text-xs text-stone-700" aria-live="polite">
        {decoded === null ? (
          `template value ${preset}`
        ) : decoded.ok ? (
          `= ${formatSi(decoded.d.nominal, kind === 'resistor' ? 'Ω' : 'F')}${decoded.d.volts ? ` ${decoded.d.volts} V` : ''} (${decoded.d.how})`
        ) : (
          <span className="text-red-800">{decoded.message}</span>
        )}
      </span>
    </li>
  );
}

/** A section marked on the photo: its template, the nets it meets other sections on, and its part values. */
export function SectionForm({ section, onChange, onRemove }: { section: CaptureSection; onChange: (s: CaptureSection) => void; onRemove: () => void }) {
  const info = TEMPLATE_INFO.find((t) => t.template === section.template)!;
  const parts = useMemo(
    () => TEMPLATES[section.template]!({ id: section.id, base: section.base, nets: {}, params: {} }).parts.filter((p) => (MARKED as string[]).includes(p.kind)),
    [section.template, section.id, section.base],
  );
  const setValue = (d: string, marking: string, value: number | null) => {
    const values = { ...section.values };
    const markings = { ...section.markings };
    if (value === null) delete values[d];
    else values[d] = value;
    if (marking) markings[d] = marking;
    else delete markings[d];
    onChange({ ...section, values, markings });
  };
  return (
    <fieldset className="space-y-2 rounded-md border border-stone-300 p-2">
      <legend className="px-1 font-semibold">
        {section.title || info.title} ({section.id})
      </legend>
      <label className="flex flex-col text-sm">
        Template
        <select
          className={input}
          value={section.template}
          onChange={(e) => onChange({ ...section, template: e.target.value as CaptureSection['template'], nets: {}, values: {}, markings: {} })}
        >
          {TEMPLATE_INFO.map((t) => (
            <option key={t.template} value={t.template}>
              {t.title}
            </option>
          ))}
        </select>
      </label>
      <div className="grid grid-cols-2 gap-2">
        {info.ports.map((p) => (
          <label key={p.port} className="flex flex-col text-sm">
            Net: {p.label}
            <input
              className={input}
              value={section.nets[p.port] ?? ''}
              placeholder={p.default}
              onChange={(e) => {
                const nets = { ...section.nets };
                if (e.target.value.trim()) nets[p.port] = e.target.value.trim();
                else delete nets[p.port];
                onChange({ ...section, nets });
              }}
            />
          </label>
        ))}
      </div>
      <p className="text-xs text-stone-700">Sections meet where they name the same net (e.g. the regulator's 15 V rail and the switch's 15 V in).</p>
      <h4 className="text-sm font-semibold">Part values, as printed</h4>
      <ul className="space-y-1 text-sm">
        {parts.map((p) => (
          <PartValue
            key={`${section.template}-${p.designator}`}
            designator={p.designator}
            kind={p.kind as MarkedKind}
            preset={p.value}
            marking={section.markings[p.designator] ?? ''}
            onValue={(m, v) => setValue(p.designator, m, v)}
          />
        ))}
      </ul>
      <button type="button" className="min-h-11 rounded-md border border-red-800 px-3 text-sm text-red-800" onClick={onRemove}>
        Remove section
      </button>
    </fieldset>
  );
}
