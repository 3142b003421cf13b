import { zodResolver } from '@hookform/resolvers/zod';
import { createJobRequest, meterProfileIds, meterProfileLabels } from '@splitscope/contract';
import { useState } from 'react';
import { useForm, useWatch } from 'react-hook-form';
import { useNavigate } from 'react-router-dom';
import type { z } from 'zod';
import { EarlierJobs, WarrantyFlag } from '@/components/board-history/board-history';
import { PageHeader } from '@/components/ui/page-header';
import { useBoardHistory } from '@/lib/api/get-board-history';
import { useCreateJob } from '../api/create-job';
import { useBoards } from '@/lib/api/get-boards';
import { useCustomers } from '../api/get-customers';
import { useFaultCodes } from '../api/get-fault-codes';
import { useUsers } from '../api/get-users';
import { uploadPhoto } from '../api/upload-photo';
import { formSubmit } from '@/lib/form-submit';
import { UNLISTED, UnlistedBoardFields, useUnlistedBoard } from './unlisted-board';

type FormIn = z.input<typeof createJobRequest>;
type FormOut = z.output<typeof createJobRequest>;

const field = 'mt-1 block min-h-11 w-full rounded-md border border-stone-500 bg-white px-3';

function Err({ msg }: { msg?: string }) {
  return msg ? <span className="text-sm text-high">{msg}</span> : null;
}

/** Intake: who sent the board, which unit and board model, and what the unit showed. */
function NewJobPage() {
  const customers = useCustomers();
  const boards = useBoards();
  const users = useUsers();
  const create = useCreateJob();
  const navigate = useNavigate();
  const [photos, setPhotos] = useState<File[]>([]);
  const form = useForm<FormIn, unknown, FormOut>({
    resolver: zodResolver(createJobRequest),
    defaultValues: {
      idempotencyKey: crypto.randomUUID(),
      customerId: '',
      unitDescription: '',
      serial: '',
      unitSerial: '',
      boardId: '',
      faultCode: '',
      symptom: '',
      priority: 'normal',
      assigneeId: null,
    },
  });
  const boardId = useWatch({ control: form.control, name: 'boardId' });
  const faultCode = useWatch({ control: form.control, name: 'faultCode' });
  const serial = useWatch({ control: form.control, name: 'serial' });
  const unitSerial = useWatch({ control: form.control, name: 'unitSerial' });
  const history = useBoardHistory({ serial: serial ?? undefined, unitSerial: unitSerial ?? undefined });
  const codes = useFaultCodes(boardId && boardId !== UNLISTED ? boardId : undefined);
  const code = (faultCode ?? '').trim().toUpperCase();
  const match = code ? codes.data?.items.find((c) => c.code.toUpperCase() === code) : undefined;
  const e = form.formState.errors;
  const unlisted = useUnlistedBoard(boardId === UNLISTED);

  // The job is opened once (the idempotency key makes a second click the same job); its photos go after it, and a
  // photo that fails is shown on the job's Photos tab (the server records a refusal), never here on the form.
  const submit = form.handleSubmit(async (v) => {
    const listedId = await unlisted.boardIdFor(v.boardId, photos);
    if (!listedId) return;
    const job = await create.mutateAsync({ ...v, boardId: listedId });
    let failed = false;
    for (const f of photos) {
      try {
        await uploadPhoto(f, job.id);
      } catch {
        failed = true;
      }
    }
    void navigate(failed ? `/jobs/${job.id}?tab=photos` : `/jobs/${job.id}`);
  });

  return (
    <section className="max-w-3xl">
      <PageHeader title="Open a job (intake)" />
      <form onSubmit={formSubmit(submit)} noValidate className="grid gap-4 sm:grid-cols-2">
        <label className="block">
          <span className="text-sm font-medium">Customer</span>
          <select className={field} {...form.register('customerId')} aria-invalid={!!e.customerId}>
            <option value="">{customers.isPending ? 'Loading…' : 'Choose a customer'}</option>
            {customers.data?.items.map((c) => (
              <option key={c.id} value={c.id}>
                {c.name}
                {c.company ? ` (${c.company})` : ''}
              </option>
            ))}
          </select>
          {customers.isError && <Err msg={`Customers could not be loaded: ${customers.error.message}`} />}
          <Err msg={e.customerId && 'Choose the customer'} />
        </label>
        <label className="block">
          <span className="text-sm font-medium">Board model</span>
          <select className={field} {...form.register('boardId')} aria-invalid={!!e.boardId}>
            <option value="">{boards.isPending ? 'Loading…' : 'Choose the board model'}</option>
            {boards.data?.items.map((b) => (
              <option key={b.id} value={b.id}>
                {b.name} (v{b.version})
              </option>
            ))}
            <option value={UNLISTED}>Board not in the library yet</option>
          </select>
          {boards.isError && <Err msg={`Boards could not be loaded: ${boards.error.message}`} />}
          <Err msg={e.boardId && 'Choose the board model'} />
        </label>
        <UnlistedBoardFields state={unlisted} />
        <label className="block">
          <span className="text-sm font-medium">Unit (make-free description, model line)</span>
          <input className={field} {...form.register('unitDescription')} aria-invalid={!!e.unitDescription} />
          <Err msg={e.unitDescription?.message} />
        </label>
        <label className="block">
          <span className="text-sm font-medium">Board serial (optional)</span>
          <input className={field} {...form.register('serial')} autoComplete="off" />
        </label>
        <label className="block">
          <span className="text-sm font-medium">Unit serial (optional)</span>
          <input className={field} {...form.register('unitSerial')} autoComplete="off" />
        </label>
        {/* A board that was here before: its earlier jobs and, within the warranty days, the flag. */}
        <div aria-live="polite" className="space-y-2 sm:col-span-2">
          {history.isError && <Err msg={`The serial's history could not be loaded: ${history.error.message}`} />}
          {history.data && history.data.jobs.length > 0 && (
            <>
              <WarrantyFlag history={history.data} />
              <p className="text-sm font-medium">
                This serial was here before ({history.data.jobs.length} {history.data.jobs.length === 1 ? 'job' : 'jobs'}):
              </p>
              <EarlierJobs history={history.data} />
            </>
          )}
        </div>
        <div className="sm:col-span-2">
          <label className="block max-w-xs">
            <span className="text-sm font-medium">Reported fault code</span>
            <input className={`${field} font-mono uppercase`} {...form.register('faultCode')} autoComplete="off" />
          </label>
          <div aria-live="polite" className="mt-2 text-sm">
            {!boardId && code && <p className="text-stone-700">Choose the board model to look the code up.</p>}
            {boardId && codes.isPending && code && <p>Looking up the code…</p>}
            {codes.isError && <Err msg={`The code table could not be loaded: ${codes.error.message}`} />}
            {boardId && code && codes.data && !match && <p className="text-stone-700">{code} is not in this board family’s code table.</p>}
            {match && (
              <div className="rounded-md border border-copper bg-amber-50 p-2" data-testid="fault-code-match">
                <p className="font-semibold">
                  {match.code}: {match.title}
                </p>
                {match.description && <p>{match.description}</p>}
                <p>
                  Suspect sections: <strong>{match.sections.join(', ') || 'none named'}</strong>
                </p>
              </div>
            )}
          </div>
        </div>
        <label className="block sm:col-span-2">
          <span className="text-sm font-medium">Symptom</span>
          <textarea rows={3} className={`${field} py-2`} {...form.register('symptom')} aria-invalid={!!e.symptom} />
          <Err msg={e.symptom?.message} />
        </label>
        <label className="block">
          <span className="text-sm font-medium">Priority</span>
          <select className={field} {...form.register('priority')}>
            <option value="low">Low</option>
            <option value="normal">Normal</option>
            <option value="high">High</option>
          </select>
        </label>
        <label className="block">
          <span className="text-sm font-medium">Meter</span>
          <select className={field} {...form.register('meterProfile', { setValueAs: (v: string) => v || null })}>
            <option value="">Shop's default meter</option>
            {meterProfileIds.map((id) => (
              <option key={id} value={id}>
                {meterProfileLabels[id]}
              </option>
            ))}
          </select>
        </label>
        <label className="block">
          <span className="text-sm font-medium">Assign to</span>
          <select className={field} {...form.register('assigneeId', { setValueAs: (v: string) => v || null })}>
            <option value="">Nobody yet</option>
            {users.data?.items
              .filter((u) => u.role !== 'admin')
              .map((u) => (
                <option key={u.id} value={u.id}>
                  {u.name}
                </option>
              ))}
          </select>
        </label>
        <label className="block sm:col-span-2">
          <span className="text-sm font-medium">Photos of the board as received (PNG or JPEG)</span>
          <input
            type="file"
            accept="image/png,image/jpeg"
            multiple
            onChange={(ev) => setPhotos(Array.from(ev.target.files ?? []))}
            className="mt-1 block min-h-11 w-full"
          />
        </label>
        {(create.error || unlisted.error) && (
          <p role="alert" className="rounded-md bg-red-50 p-2 text-sm text-high sm:col-span-2">
            {unlisted.error ?? create.error?.message}
          </p>
        )}
        <div className="sm:col-span-2">
          <button
            type="submit"
            disabled={form.formState.isSubmitting || form.formState.isSubmitSuccessful}
            className="min-h-11 rounded-md bg-board px-6 font-semibold text-white"
          >
            {form.formState.isSubmitting ? 'Opening…' : 'Open the job'}
          </button>
        </div>
      </form>
    </section>
  );
}

export default NewJobPage;
