import { type ImportRow, type JobDetail, type MeterImportResult } from '@splitscope/contract';
import { useState } from 'react';
import { Link, useParams } from 'react-router-dom';
import { PageHeader } from '@/components/ui/page-header';
import { QueryState } from '@/components/ui/query-state';
import { useJob } from '@/lib/api/get-job';
import { METER_LABEL, meterText } from '@/lib/format';
import { useMeterImport, useMeterProfiles } from '../api/meter-import';
import { ProfileForm } from './profile-form';

const field = 'mt-1 block min-h-11 w-full rounded-md border border-stone-500 bg-white px-3';

const headerOf = (csv: string) => {
  const line = csv.replace(/^\uFEFF/, '').split(/\r?\n/, 1)[0] ?? '';
  const d = [';', '\t', ','].reduce((best, x) => (line.split(x).length > line.split(best).length ? x : best), ',');
  return line
    .split(d)
    .map((c) => c.trim().replace(/^"|"$/g, ''))
    .filter(Boolean);
};

function RowsTable({
  rows,
  points,
  bind,
  bindings,
}: {
  rows: ImportRow[];
  points: { id: string; label: string }[];
  bind: (line: number, point: string) => void;
  bindings: Record<string, string>;
}) {
  return (
    <div className="overflow-x-auto rounded-lg border border-stone-300 bg-white">
      <table className="w-full text-left text-sm">
        <caption className="p-2 text-left font-semibold">Rows of the log</caption>
        <thead>
          <tr className="border-b border-stone-300">
            {['Line', 'Test point', 'Black probe', 'Meter function', 'Read', 'Taken', 'Check'].map((h) => (
              <th key={h} scope="col" className="px-2 py-1">
                {h}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {rows.map((r) => (
            <tr key={r.line} className={`border-b border-stone-200 align-top ${r.error ? 'bg-red-50' : ''}`}>
              <td className="px-2 py-1">{r.line}</td>
              <td className="px-2 py-1">
                {r.point && !bindings[r.line] ? (
                  r.point
                ) : (
                  <select
                    aria-label={`Test point for line ${r.line}`}
                    className="min-h-11 rounded-md border border-stone-500 px-1"
                    value={bindings[r.line] ?? ''}
                    onChange={(e) => bind(r.line, e.target.value)}
                  >
                    <option value="">Bind to…</option>
                    {points.map((p) => (
                      <option key={p.id} value={p.id}>
                        {p.label}
                      </option>
                    ))}
                  </select>
                )}
              </td>
              <td className="px-2 py-1">{r.reference === 'gnd' ? 'bus negative' : r.reference}</td>
              <td className="px-2 py-1">{r.mode ? METER_LABEL[r.mode] : '—'}</td>
              <td className="px-2 py-1 font-mono">
                {r.raw}
                {r.value !== null && r.mode && (
                  <span className="block font-sans text-stone-700">{meterText(r.value, r.mode === 'dcv' || r.mode === 'diode' ? 'V' : 'ohm')}</span>
                )}
              </td>
              <td className="px-2 py-1">{r.takenAt ? new Date(r.takenAt).toLocaleTimeString() : '—'}</td>
              <td className="px-2 py-1">{r.error ? <span className="font-semibold text-high">{r.error}</span> : r.readingId ? 'stored' : 'ready'}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

function Importer({ job }: { job: JobDetail }) {
  const profiles = useMeterProfiles();
  const preview = useMeterImport(job.id, 'preview');
  const store = useMeterImport(job.id, 'import');
  const [profileId, setProfileId] = useState('');
  const [editing, setEditing] = useState(false);
  const [csv, setCsv] = useState('');
  const [fileName, setFileName] = useState('');
  const [importKey, setImportKey] = useState(() => crypto.randomUUID());
  const [phase, setPhase] = useState<'diagnosis' | 'verification'>(['repaired', 'approved'].includes(job.status) ? 'verification' : 'diagnosis');
  const [bindings, setBindings] = useState<Record<string, string>>({});
  const [done, setDone] = useState<MeterImportResult | null>(null);
  const points = ((job.board.document as { testPoints?: { id: string; label?: string }[] }).testPoints ?? []).map((t) => ({
    id: t.id,
    label: t.label ? `${t.id} ${t.label}` : t.id,
  }));
  const profile = profiles.data?.items.find((p) => p.id === profileId) ?? null;
  const request = { importKey, profileId, csv, phase, bindings };
  const run = (next: Record<string, string> = bindings) => preview.mutate({ ...request, bindings: next });
  const shown = done ?? preview.data;

  return (
    <div className="space-y-4">
      <div className="grid gap-3 rounded-lg border border-stone-300 bg-white p-3 sm:grid-cols-3">
        <label className="block">
          <span className="text-sm font-medium">Meter log (CSV)</span>
          <input
            type="file"
            accept=".csv,text/csv,text/plain"
            className="mt-1 block min-h-11 w-full"
            onChange={(e) => {
              const f = e.target.files?.[0];
              if (!f) return;
              setFileName(f.name);
              setImportKey(crypto.randomUUID());
              setBindings({});
              setDone(null);
              preview.reset();
              void f.text().then(setCsv);
            }}
          />
        </label>
        <div>
          <label className="block">
            <span className="text-sm font-medium">Meter profile</span>
            <select className={field} value={profileId} onChange={(e) => setProfileId(e.target.value)}>
              <option value="">{profiles.isPending ? 'Loading…' : 'Choose the meter'}</option>
              {profiles.data?.items.map((p) => (
                <option key={p.id} value={p.id}>
                  {p.name}
                </option>
              ))}
            </select>
          </label>
          <button type="button" className="mt-1 min-h-11 text-sm text-board underline" onClick={() => setEditing(!editing)}>
            {profile ? 'Change this meter’s columns' : 'New meter profile'}
          </button>
        </div>
        <label className="block">
          <span className="text-sm font-medium">Readings for</span>
          <select className={field} value={phase} onChange={(e) => setPhase(e.target.value as typeof phase)}>
            <option value="diagnosis">Diagnosis</option>
            <option value="verification">Verification after the repair</option>
          </select>
        </label>
      </div>
      {editing && (
        <ProfileForm
          key={profile?.id ?? 'new'}
          columns={headerOf(csv)}
          start={profile}
          onSaved={(p) => {
            setProfileId(p.id);
            setEditing(false);
          }}
        />
      )}
      <div className="flex flex-wrap gap-2">
        <button
          type="button"
          disabled={!csv || !profileId || preview.isPending}
          onClick={() => (setDone(null), run())}
          className="min-h-11 rounded-md bg-board px-4 font-semibold text-white disabled:opacity-50"
        >
          Preview {fileName || 'the log'}
        </button>
        {preview.data && !done && preview.data.good > 0 && (
          <button
            type="button"
            disabled={store.isPending}
            onClick={() => store.mutate(request, { onSuccess: setDone })}
            className="min-h-11 rounded-md bg-board px-4 font-semibold text-white"
          >
            Import {preview.data.good} {preview.data.good === 1 ? 'reading' : 'readings'}
            {preview.data.bad ? `, skip ${preview.data.bad} ${preview.data.bad === 1 ? 'row' : 'rows'}` : ''}
          </button>
        )}
      </div>
      <div aria-live="polite" className="space-y-2">
        {(preview.error ?? store.error) && (
          <p role="alert" className="rounded-md bg-red-50 p-2 text-sm text-high">
            {(preview.error ?? store.error)?.message}
          </p>
        )}
        {preview.data && !done && (
          <p>
            Nothing is stored until you import. {preview.data.good} rows ready, {preview.data.bad} with a problem.
          </p>
        )}
        {done && (
          <p role="status" className="font-semibold">
            Stored {done.stored} {done.stored === 1 ? 'reading' : 'readings'} ({done.good} rows imported, {done.bad} skipped).{' '}
            <Link className="text-board underline" to={`/jobs/${job.id}`}>
              Back to the bench
            </Link>
          </p>
        )}
      </div>
      {shown && (
        <RowsTable
          rows={shown.rows}
          points={points}
          bindings={bindings}
          bind={(line, point) => {
            const next = { ...bindings, [line]: point };
            setBindings(next);
            if (!done) run(next);
          }}
        />
      )}
    </div>
  );
}

/** Readings a meter logged, imported from its CSV onto this job's test points. */
function MeterImportPage() {
  const { id = '' } = useParams();
  const job = useJob(id);
  return (
    <section className="max-w-5xl space-y-3">
      <PageHeader title={job.data ? `Job #${job.data.number}: import a meter log` : 'Import a meter log'}>
        <Link className="inline-flex min-h-11 items-center text-board underline" to={`/jobs/${id}`}>
          Back to the bench
        </Link>
      </PageHeader>
      <QueryState query={job} label="the job">
        {(j) => <Importer job={j} />}
      </QueryState>
    </section>
  );
}

export default MeterImportPage;
