import { meterModes, type MeterColumnMapping, type MeterProfile } from '@splitscope/contract';
import { useState } from 'react';
import { METER_LABEL } from '@/lib/format';
import { useSaveMeterProfile } from '../api/meter-import';

const field = 'mt-1 block min-h-11 w-full rounded-md border border-stone-500 bg-white px-3';
const COLUMNS: [keyof MeterColumnMapping, string, boolean][] = [
  ['point', 'Test point column', true],
  ['value', 'Reading column', true],
  ['unit', 'Unit column', false],
  ['function', 'Meter function column', false],
  ['reference', 'Black probe column', false],
  ['time', 'Time column', false],
];

/** A meter's column mapping, saved under the meter's name; the file's header offers the column names. */
export function ProfileForm({ columns, start, onSaved }: { columns: string[]; start: MeterProfile | null; onSaved: (p: MeterProfile) => void }) {
  const save = useSaveMeterProfile();
  const [name, setName] = useState(start?.name ?? '');
  const [mapping, setMapping] = useState<Partial<MeterColumnMapping>>(start?.mapping ?? {});
  const [defaultMode, setMode] = useState(start?.defaultMode ?? 'dcv');
  const [power, setPower] = useState(start?.power ?? 'on');
  const [defaultReference, setReference] = useState(start?.defaultReference ?? 'gnd');
  const submit = (e: React.FormEvent) => {
    e.preventDefault();
    const chosen = Object.fromEntries(Object.entries(mapping).filter(([, v]) => v)) as MeterColumnMapping;
    save.mutate({ name, mapping: chosen, defaultMode, power, defaultReference }, { onSuccess: onSaved });
  };
  return (
    <form onSubmit={submit} noValidate aria-labelledby="profile-h" className="grid gap-3 rounded-lg border border-stone-300 bg-white p-3 sm:grid-cols-3">
      <h2 id="profile-h" className="text-lg font-semibold sm:col-span-3">
        Meter profile: which column holds what
      </h2>
      <label className="block sm:col-span-3">
        <span className="text-sm font-medium">Meter name</span>
        <input className={field} value={name} onChange={(e) => setName(e.target.value)} autoComplete="off" />
      </label>
      {COLUMNS.map(([key, label, required]) => (
        <label key={key} className="block">
          <span className="text-sm font-medium">
            {label}
            {required ? '' : ' (optional)'}
          </span>
          <select className={field} value={mapping[key] ?? ''} onChange={(e) => setMapping({ ...mapping, [key]: e.target.value || undefined })}>
            <option value="">{required ? 'Choose a column' : 'None in this log'}</option>
            {[...new Set([...columns, ...(mapping[key] ? [mapping[key]] : [])])].map((c) => (
              <option key={c} value={c}>
                {c}
              </option>
            ))}
          </select>
        </label>
      ))}
      <label className="block">
        <span className="text-sm font-medium">Meter function without a column</span>
        <select className={field} value={defaultMode} onChange={(e) => setMode(e.target.value as typeof defaultMode)}>
          {meterModes.map((m) => (
            <option key={m} value={m}>
              {METER_LABEL[m]}
            </option>
          ))}
        </select>
      </label>
      <label className="block">
        <span className="text-sm font-medium">Board state while logging</span>
        <select className={field} value={power} onChange={(e) => setPower(e.target.value as typeof power)}>
          <option value="on">Powered</option>
          <option value="off">Unpowered, bus discharged</option>
        </select>
      </label>
      <label className="block">
        <span className="text-sm font-medium">Black probe without a column</span>
        <input className={field} value={defaultReference} onChange={(e) => setReference(e.target.value)} autoComplete="off" />
      </label>
      <div aria-live="polite" className="sm:col-span-3">
        {save.error && (
          <p role="alert" className="text-sm text-high">
            {save.error.message}
          </p>
        )}
      </div>
      <div className="sm:col-span-3">
        <button type="submit" disabled={save.isPending} className="min-h-11 rounded-md border border-board px-4 font-semibold text-board">
          Save the meter profile
        </button>
      </div>
    </form>
  );
}
