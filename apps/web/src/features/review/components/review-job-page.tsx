import { zodResolver } from '@hookform/resolvers/zod';
import { boardWords, canApprove, createReviewRequest, type BoardWords, type JobDetail } from '@splitscope/contract';
import { useMemo, useState } from 'react';
import { useForm } from 'react-hook-form';
import { Link, useNavigate, useParams } from 'react-router-dom';
import type { z } from 'zod';
import { QueryState } from '@/components/ui/query-state';
import { StatusBadge } from '@/components/ui/status-badge';
import { useMe } from '@/lib/api/me';
import { useJob } from '@/lib/api/get-job';
import { useReadings } from '@/lib/api/get-readings';
import { ReadingsTable } from '@/components/readings/readings-table';
import { boardView } from '@/lib/board/board-view';
import { dateTime } from '@/lib/format';
import { useCreateReview } from '../api/create-review';

type In = z.input<typeof createReviewRequest>;
type Out = z.output<typeof createReviewRequest>;

function Decision({ job, words }: { job: JobDetail; words: BoardWords }) {
  const review = useCreateReview(job.id);
  const navigate = useNavigate();
  const form = useForm<In, unknown, Out>({ resolver: zodResolver(createReviewRequest), defaultValues: { decision: 'approve', comment: '' } });
  const [confirming, setConfirming] = useState(false);
  const part = words.designator(job.proposedPart ?? '');
  const send = (decision: 'approve' | 'send-back') => {
    // Approving sends the iron to the board: the lead says yes twice, the second time naming the part.
    if (decision === 'approve' && !confirming) return setConfirming(true);
    setConfirming(false);
    form.setValue('decision', decision);
    void form.handleSubmit(async (v) => {
      await review.mutateAsync(v);
      void navigate('/review');
    })();
  };
  return (
    <form onSubmit={(e) => e.preventDefault()} className="space-y-2 rounded-lg border border-stone-300 bg-white p-3" noValidate>
      <h2 className="text-lg font-semibold">Decision</h2>
      <label className="block">
        <span className="text-sm font-medium">Comment (needed to send back)</span>
        <textarea rows={3} className="mt-1 block w-full rounded-md border border-stone-500 p-2" {...form.register('comment')} />
      </label>
      {form.formState.errors.comment && <p className="text-sm text-high">{form.formState.errors.comment.message}</p>}
      {review.error && (
        <p role="alert" className="text-sm text-high">
          {review.error.message}
        </p>
      )}
      {confirming && (
        <p role="alert" className="rounded-md border border-amber-600 bg-amber-50 p-2 text-sm">
          Approve {part} as the faulty part? The technician will desolder and replace it. Check the evidence and the readings with their board state first.
        </p>
      )}
      <div className="flex flex-wrap gap-2">
        <button type="button" onClick={() => send('approve')} disabled={review.isPending} className="min-h-11 rounded-md bg-ok px-4 font-semibold text-white">
          {confirming ? `Yes, approve: replace ${part}` : `Approve ${part}`}
        </button>
        {confirming && (
          <button type="button" onClick={() => setConfirming(false)} className="min-h-11 rounded-md border border-stone-400 bg-white px-4 font-semibold">
            Cancel
          </button>
        )}
        <button
          type="button"
          onClick={() => send('send-back')}
          disabled={review.isPending}
          className="min-h-11 rounded-md border-2 border-high bg-white px-4 font-semibold text-high"
        >
          Send back
        </button>
      </div>
    </form>
  );
}

function Review({ job }: { job: JobDetail }) {
  const me = useMe();
  const readings = useReadings(job.id);
  const model = useMemo(() => boardView(job.board.document).model, [job.board.document]);
  const words = useMemo(() => boardWords(model), [model]);
  const snap = job.latestSnapshot?.output;
  const canDecide = canApprove(job.status, me.data?.role);
  return (
    <div className="space-y-4">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <h1 className="text-2xl font-semibold">
          Review job #{job.number} · {job.boardName}
        </h1>
        <StatusBadge status={job.status} />
      </div>
      <p>
        {job.customerName} · {job.unitDescription} · {job.faultCode ? `code ${job.faultCode} · ` : ''}
        {job.symptom}
      </p>
      <p className="text-lg">
        Proposed part: <strong data-testid="proposed-part">{job.proposedPart ? words.designator(job.proposedPart) : '—'}</strong> by{' '}
        {job.assigneeName ?? 'the technician'}
      </p>
      {job.proposalNote && (
        <blockquote className="rounded-md border-l-4 border-copper bg-white p-2" data-testid="proposal-note">
          <span className="block text-sm font-semibold">The technician’s note</span>“{job.proposalNote}”
        </blockquote>
      )}
      <div className="grid gap-4 lg:grid-cols-2">
        <section aria-labelledby="snap-h" className="rounded-lg border border-stone-300 bg-white p-3">
          <h2 id="snap-h" className="mb-2 text-lg font-semibold">
            Ranking when proposed
          </h2>
          {!snap ? (
            <p className="text-sm text-stone-700">No engine snapshot was stored with the proposal.</p>
          ) : (
            <ol className="space-y-2">
              {snap.parts.slice(0, 8).map((p) => (
                <li key={`${p.part}-${p.mode}`}>
                  <div className="flex justify-between text-sm">
                    <span className="font-semibold">{p.label ?? words.fault(p.part, p.mode)}</span>
                    <span className="tabular-nums">{(p.probability * 100).toFixed(1)} %</span>
                  </div>
                  <div className="h-2.5 rounded-full bg-stone-200">
                    <div className="h-full rounded-full bg-copper" style={{ width: `${Math.max(1, p.probability * 100)}%` }} />
                  </div>
                </li>
              ))}
            </ol>
          )}
        </section>
        <section aria-labelledby="hist-h" className="rounded-lg border border-stone-300 bg-white p-3">
          <h2 id="hist-h" className="mb-2 text-lg font-semibold">
            Readings history
          </h2>
          <QueryState query={readings} label="the readings">
            {(d) => <ReadingsTable readings={d.items} model={model} caption="Readings with the board state each was taken in" />}
          </QueryState>
        </section>
      </div>
      {job.reviews.length > 0 && (
        <section aria-labelledby="prev-h">
          <h2 id="prev-h" className="text-lg font-semibold">
            Earlier reviews
          </h2>
          <ul className="text-sm">
            {job.reviews.map((r) => (
              <li key={r.id}>
                {dateTime(r.createdAt)} · {r.reviewerName}: {r.decision === 'approve' ? 'approved' : 'sent back'} {r.comment && `— “${r.comment}”`}
              </li>
            ))}
          </ul>
        </section>
      )}
      {canDecide ? <Decision job={job} words={words} /> : <p className="text-sm text-stone-700">Only a lead decides a review.</p>}
      <Link to={`/jobs/${job.id}?mode=free`} className="inline-flex min-h-11 items-center font-semibold text-board underline">
        Open the bench for this job
      </Link>
    </div>
  );
}

function ReviewJobPage() {
  const { id = '' } = useParams();
  const job = useJob(id);
  return (
    <QueryState query={job} label="the job">
      {(j) => <Review job={j} />}
    </QueryState>
  );
}

export default ReviewJobPage;
