import { zodResolver } from '@hookform/resolvers/zod';
import { createRepairRequest, repairActions, type JobDetail } from '@splitscope/contract';
import { useForm } from 'react-hook-form';
import { Link, useParams } from 'react-router-dom';
import type { z } from 'zod';
import { Caution } from '@/components/ui/caution';
import { QueryState } from '@/components/ui/query-state';
import { StatusBadge } from '@/components/ui/status-badge';
import { useJob } from '@/lib/api/get-job';
import { useReadings } from '@/lib/api/get-readings';
import { useUpdateJob } from '@/lib/api/update-job';
import { dateTime } from '@/lib/format';
import { useCreateRepair } from '../api/create-repair';
import { useRepairs } from '@/lib/api/get-repairs';
import { usePartsBin } from '@/lib/api/parts-bin';
import { ReturnForm } from './return-form';
import { VerificationChecklist } from './verification-checklist';
import { formSubmit } from '@/lib/form-submit';

type In = z.input<typeof createRepairRequest>;
type Out = z.output<typeof createRepairRequest>;
const input = 'mt-1 block min-h-11 w-full rounded-md border border-stone-500 bg-white px-3';

function RepairForm({ job }: { job: JobDetail }) {
  const create = useCreateRepair(job.id);
  const update = useUpdateJob(job.id);
  const bin = usePartsBin();
  const form = useForm<In, unknown, Out>({
    resolver: zodResolver(createRepairRequest),
    defaultValues: { part: job.proposedPart ?? '', action: 'replaced', replacementValue: '', marking: '', notes: '', binQuantity: 1 },
  });
  const submit = form.handleSubmit(async (v) => {
    // A refused repair (a drawer that does not fit) shows from the mutation state; it is not an uncaught error.
    if (
      !(await create.mutateAsync(v).then(
        () => true,
        () => false,
      ))
    )
      return;
    if (job.allowedTransitions.includes('repaired')) await update.mutateAsync({ status: 'repaired' });
    // The drawer is not kept: saving again must not take a second part from it.
    form.reset({ ...v, notes: '', binPartId: undefined, binQuantity: 1 });
  });
  const err = create.error ?? update.error;
  return (
    <form onSubmit={formSubmit(submit)} noValidate className="grid gap-3 rounded-lg border border-stone-300 bg-white p-3 sm:grid-cols-2">
      <h2 className="text-lg font-semibold sm:col-span-2">Record a repair action</h2>
      <label>
        <span className="text-sm font-medium">Part (designator)</span>
        <input className={input} {...form.register('part')} />
        {form.formState.errors.part && <span className="text-sm text-high">{form.formState.errors.part.message}</span>}
      </label>
      <label>
        <span className="text-sm font-medium">Action</span>
        <select className={input} {...form.register('action')}>
          {repairActions.map((a) => (
            <option key={a} value={a}>
              {a}
            </option>
          ))}
        </select>
      </label>
      <label>
        <span className="text-sm font-medium">Fitted from the parts bin (optional)</span>
        <select className={input} {...form.register('binPartId', { setValueAs: (v: string) => v || undefined })}>
          <option value="">Not from the bin</option>
          {bin.data?.items
            .filter((p) => p.quantity > 0)
            .map((p) => (
              <option key={p.id} value={p.id}>
                {p.value} {p.package}
                {p.rating ? ` ${p.rating}` : ''} · drawer {p.drawer} · {p.quantity} left
              </option>
            ))}
        </select>
        <span className="text-sm text-stone-700">The drawer’s value and package are checked against the board’s part.</span>
      </label>
      <label>
        <span className="text-sm font-medium">How many from the bin</span>
        <input type="number" min={1} max={100} className={input} {...form.register('binQuantity', { valueAsNumber: true })} />
      </label>
      <label>
        <span className="text-sm font-medium">Replacement value</span>
        <input className={input} {...form.register('replacementValue')} placeholder="e.g. 10k" />
      </label>
      <label>
        <span className="text-sm font-medium">Marking on the fitted part</span>
        <input className={input} {...form.register('marking')} />
      </label>
      <label className="sm:col-span-2">
        <span className="text-sm font-medium">Notes</span>
        <textarea rows={2} className={`${input} py-2`} {...form.register('notes')} />
      </label>
      {err && (
        <p role="alert" className="text-sm text-high sm:col-span-2">
          {err.message}
        </p>
      )}
      <div className="sm:col-span-2">
        <button type="submit" disabled={form.formState.isSubmitting} className="min-h-11 rounded-md bg-board px-4 font-semibold text-white">
          Save the repair
        </button>
      </div>
    </form>
  );
}

function Repair({ job }: { job: JobDetail }) {
  const repairs = useRepairs(job.id);
  const readings = useReadings(job.id);
  const canSignOff = job.allowedTransitions.includes('verified');
  const repaired = ['repaired', 'verified', 'returned'].includes(job.status);
  return (
    <div className="space-y-4">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <h1 className="text-2xl font-semibold">Repair and verification · job #{job.number}</h1>
        <StatusBadge status={job.status} />
      </div>
      <p>
        Approved part: <strong>{job.proposedPart ?? '—'}</strong> · {job.boardName}
      </p>
      <Caution title="Unplug the board and discharge the bus before desoldering">
        <p>Measure the bus below the safe threshold first. Follow your shop’s procedures, local codes and licensed practice.</p>
      </Caution>
      <QueryState query={repairs} label="repair actions">
        {(d) =>
          d.items.length > 0 ? (
            <ul className="rounded-lg border border-stone-300 bg-white p-3 text-sm">
              {d.items.map((r) => (
                <li key={r.id}>
                  {dateTime(r.createdAt)} · <strong>{r.part}</strong> {r.action}
                  {r.replacementValue ? ` with ${r.replacementValue}` : ''}
                  {r.marking ? ` (marked ${r.marking})` : ''} · {r.authorName}
                </li>
              ))}
            </ul>
          ) : (
            <p className="text-sm text-stone-700">No repair action recorded yet.</p>
          )
        }
      </QueryState>
      {['approved', 'repaired'].includes(job.status) && <RepairForm job={job} />}
      {repaired && <VerificationChecklist job={job} readings={readings.data?.items ?? []} canSignOff={canSignOff} />}
      <ReturnForm job={job} />
      <Link to={`/jobs/${job.id}/report`} className="inline-flex min-h-11 items-center font-semibold text-board underline">
        Repair report
      </Link>
    </div>
  );
}

function RepairPage() {
  const { id = '' } = useParams();
  const job = useJob(id);
  return (
    <QueryState query={job} label="the job">
      {(j) => <Repair job={j} />}
    </QueryState>
  );
}

export default RepairPage;
