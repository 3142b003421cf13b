import { canMarkBoards, hasRole, ROLES, type JobDetail, type MeterModeName } from '@splitscope/contract';
import { useState } from 'react';
import { Link } from 'react-router-dom';
import { Caution } from '@/components/ui/caution';
import { StatusBadge } from '@/components/ui/status-badge';
import { createReading } from '@/lib/api/create-reading';
import { useDraft } from '@/lib/api/get-draft';
import { useMe } from '@/lib/api/me';
import { useReadings } from '@/lib/api/get-readings';
import { METER_LABEL, readingText } from '@/lib/format';
import { parseTyped } from '@/lib/parse-reading';

const field = 'min-h-11 rounded-md border border-stone-500 bg-white px-2';

/**
 * The bench of a job whose board has no model yet: the photo with the points marked on it, readings recorded
 * against those points (unjudged: there is nothing to judge them by), and the way to mark the board.
 */
export function UnmodelledBench({ job }: { job: JobDetail }) {
  const me = useMe();
  const draft = useDraft(job.boardId);
  const readings = useReadings(job.id);
  // A version whose stored model the schema rejects keeps the test points that still read, on its own picture.
  const problem = job.board.modelProblem;
  const doc = job.board.document;
  const points = problem ? doc.testPoints : (draft.data?.capture.points ?? []);
  const photo = problem ? (job.board.pictureUrl ? doc.picture : undefined) : draft.data?.capture.photo;
  const [point, setPoint] = useState('');
  const [mode, setMode] = useState<MeterModeName>('dcv');
  const [power, setPower] = useState<'on' | 'off'>('on');
  const [text, setText] = useState('');
  const [busVolts, setBusVolts] = useState('');
  const [unplugged, setUnplugged] = useState(false);
  const [message, setMessage] = useState<{ ok: boolean; text: string } | null>(null);

  const record = async () => {
    const parsed = await parseTyped(text, mode);
    if (!parsed.ok) return setMessage({ ok: false, text: parsed.error });
    const safetyCheck = power === 'off' && unplugged && busVolts.trim() !== '' ? { unplugged: true as const, busVolts: Number(busVolts) } : undefined;
    try {
      await createReading(job.id, {
        idempotencyKey: crypto.randomUUID(),
        mode,
        red: point,
        black: 'gnd',
        power,
        value: parsed.value,
        raw: text,
        ...(parsed.beep !== undefined ? { beep: parsed.beep } : {}),
        ...(safetyCheck ? { safetyCheck } : {}),
      });
      setMessage({ ok: true, text: `Recorded at ${point}.` });
      setText('');
      await readings.refetch();
    } catch (err) {
      setMessage({ ok: false, text: (err as Error).message });
    }
  };

  return (
    <div className="space-y-3">
      <div className="flex flex-wrap items-center gap-x-3 gap-y-1">
        <h1 className="text-xl font-semibold">
          Job #{job.number} · {job.boardName}
        </h1>
        <StatusBadge status={job.status} sentBack={job.sentBack} />
        <p className="text-sm text-stone-700">
          {job.faultCode ? `code ${job.faultCode} · ` : ''}
          {job.symptom} · {job.customerName}
        </p>
      </div>
      <p role="status" className="rounded-md border border-amber-400 bg-amber-50 p-2 font-semibold">
        {problem
          ? "This board's model needs upgrading by a lead before readings can be judged."
          : 'No model for this board yet: readings are recorded, not judged.'}
      </p>
      {problem && hasRole(me.data?.role, ROLES.reviewers) && (
        <Link
          className="inline-flex min-h-11 items-center rounded-md bg-board px-4 font-semibold text-white"
          to={`/boards/${job.boardId}?version=${job.board.version}`}
        >
          Correct the board's model
        </Link>
      )}
      {!problem && canMarkBoards(me.data?.role) && (
        <Link className="inline-flex min-h-11 items-center rounded-md bg-board px-4 font-semibold text-white" to={`/boards/${job.boardId}/capture`}>
          Mark test points and sections on the photo
        </Link>
      )}
      <Caution title="Mains and the DC bus">
        This board's bus is not modelled: treat every unpowered reading as near the ~300 V bus. Unplug, discharge and measure the bus first; follow local codes
        and licensed practice.
      </Caution>
      <div className="grid gap-3 lg:grid-cols-2">
        {photo && (
          <figure className="relative">
            <img src={job.board.pictureUrl ?? `/api/uploads/${photo.uploadId ?? ''}`} alt={`Photo of ${job.boardName}`} className="w-full rounded-md" />
            {points.map((p) => (
              <span
                key={p.id}
                className="absolute -translate-x-1/2 -translate-y-1/2 rounded-full bg-amber-500 px-1 text-xs font-bold text-black"
                style={{ left: `${(p.x / photo.width) * 100}%`, top: `${(p.y / photo.height) * 100}%` }}
              >
                {p.id}
              </span>
            ))}
          </figure>
        )}
        <section aria-labelledby="record-h" className="space-y-2">
          <h2 id="record-h" className="text-lg font-semibold">
            Record a reading
          </h2>
          {points.length === 0 ? (
            <p>No test points are marked on the photo yet. Mark them first; readings are taken against the board's ground (black probe).</p>
          ) : (
            <form className="flex flex-wrap items-end gap-2" onSubmit={(e) => (e.preventDefault(), void record())}>
              <label className="flex flex-col text-sm">
                Test point (red probe)
                <select className={field} value={point} onChange={(e) => setPoint(e.target.value)} required>
                  <option value="">Choose</option>
                  {points.map((p) => (
                    <option key={p.id} value={p.id}>
                      {p.id}
                      {p.label ? ` · ${p.label}` : ''}
                    </option>
                  ))}
                </select>
              </label>
              <label className="flex flex-col text-sm">
                Meter
                <select className={field} value={mode} onChange={(e) => setMode(e.target.value as MeterModeName)}>
                  {(['dcv', 'ohm', 'diode', 'continuity'] as const).map((m) => (
                    <option key={m} value={m}>
                      {METER_LABEL[m]}
                    </option>
                  ))}
                </select>
              </label>
              <label className="flex flex-col text-sm">
                Board
                <select className={field} value={power} onChange={(e) => setPower(e.target.value as 'on' | 'off')}>
                  <option value="on">powered</option>
                  <option value="off">unplugged</option>
                </select>
              </label>
              <label className="flex flex-col text-sm">
                Reading
                <input className={field} value={text} onChange={(e) => setText(e.target.value)} placeholder="e.g. 14.9 V, 4.7k, OL" required />
              </label>
              {power === 'off' && (
                <fieldset className="flex flex-wrap items-end gap-2 rounded-md border border-red-800 p-2 text-sm">
                  <legend className="px-1">Discharge check</legend>
                  <label className="flex min-h-11 items-center gap-1">
                    <input type="checkbox" checked={unplugged} onChange={(e) => setUnplugged(e.target.checked)} /> Board unplugged
                  </label>
                  <label className="flex flex-col">
                    Bus voltage now (V)
                    <input className={field} inputMode="decimal" value={busVolts} onChange={(e) => setBusVolts(e.target.value)} />
                  </label>
                </fieldset>
              )}
              <button type="submit" className="min-h-11 rounded-md bg-board px-4 font-semibold text-white">
                Record
              </button>
            </form>
          )}
          {message && (
            <p role={message.ok ? 'status' : 'alert'} className={message.ok ? 'text-sm' : 'text-sm text-red-800'}>
              {message.text}
            </p>
          )}
          <h3 className="font-semibold">Readings ({readings.data?.items.length ?? 0})</h3>
          <ul className="text-sm">
            {readings.data?.items.map((r) => (
              <li key={r.id}>
                {r.red}: {METER_LABEL[r.mode]}, {r.power === 'on' ? 'powered' : 'unplugged'}, {readingText(r)} — not judged
              </li>
            ))}
          </ul>
        </section>
      </div>
    </div>
  );
}
