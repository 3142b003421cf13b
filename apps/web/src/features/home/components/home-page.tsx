import { jobStatusLabels, jobStatuses, type Job, type Me } from '@splitscope/contract';
import { Link } from 'react-router-dom';
import { QueryState } from '@/components/ui/query-state';
import { StatusBadge } from '@/components/ui/status-badge';
import { useMe } from '@/lib/api/me';
import { useJobs } from '@/lib/api/get-jobs';
import { age } from '@/lib/format';

const OPEN = ['received', 'diagnosing', 'awaiting-review', 'approved', 'repaired'] as const;

function JobCards({ jobs, empty, action }: { jobs: Job[]; empty: string; action: (j: Job) => { to: string; label: string } }) {
  if (jobs.length === 0) return <p className="text-stone-700">{empty}</p>;
  return (
    <ul className="grid gap-3 md:grid-cols-2 xl:grid-cols-3">
      {jobs.map((j) => {
        const a = action(j);
        return (
          <li key={j.id} className="rounded-lg border border-stone-300 bg-white p-3">
            <div className="flex items-center justify-between gap-2">
              <span className="font-semibold">
                #{j.number} · {j.boardName}
              </span>
              <StatusBadge status={j.status} sentBack={j.sentBack} />
            </div>
            <p className="text-sm text-stone-700">
              {j.customerName} · {j.faultCode ? `code ${j.faultCode} · ` : ''}
              {age(j.receivedAt)} old
            </p>
            <p className="text-sm">{j.symptom}</p>
            <Link to={a.to} className="mt-2 inline-flex min-h-11 items-center rounded-md bg-board px-4 font-semibold text-white">
              {a.label}
            </Link>
          </li>
        );
      })}
    </ul>
  );
}

/** One home list: a heading, the jobs of one query as cards, and what each card's button does. */
function JobsSection({
  id,
  title,
  note,
  ...cards
}: {
  id: string;
  title: string;
  note?: string;
  jobs: ReturnType<typeof useJobs>;
  label: string;
  empty: string;
  action: (j: Job) => { to: string; label: string };
}) {
  return (
    <section aria-labelledby={id} className="space-y-2">
      <h2 id={id} className="text-xl font-semibold">
        {title}
      </h2>
      {note && <p className="text-sm text-stone-700">{note}</p>}
      <QueryState query={cards.jobs} label={cards.label}>
        {(d) => <JobCards jobs={d.items} empty={cards.empty} action={cards.action} />}
      </QueryState>
    </section>
  );
}

function TechHome() {
  const jobs = useJobs({ assignee: 'me', status: OPEN.join(',') });
  return (
    <JobsSection
      id="mine-h"
      title="My open jobs"
      jobs={jobs}
      label="your jobs"
      empty="No open jobs are assigned to you."
      action={(j) =>
        j.status === 'approved'
          ? { to: `/jobs/${j.id}/repair`, label: 'Record the repair' }
          : j.status === 'repaired'
            ? { to: `/jobs/${j.id}/repair`, label: 'Verify the board' }
            : { to: `/jobs/${j.id}`, label: 'Open the bench' }
      }
    />
  );
}

function TraineeHome() {
  const jobs = useJobs({ assignee: 'me', status: 'received,diagnosing' });
  return (
    <JobsSection
      id="steps-h"
      title="My assigned steps"
      note="Each job opens in guided order: one step at a time, with the safety gates."
      jobs={jobs}
      label="your assigned jobs"
      empty="Nothing is assigned to you right now."
      action={(j) => ({ to: `/jobs/${j.id}?mode=guided`, label: 'Continue the guided order' })}
    />
  );
}

function LeadHome() {
  const jobs = useJobs({ status: 'awaiting-review' });
  const signOff = useJobs({ status: 'repaired' });
  return (
    <>
      <JobsSection
        id="signoff-h"
        title="Repairs waiting for your sign-off"
        jobs={signOff}
        label="the repairs waiting for sign-off"
        empty="No repaired board is waiting for sign-off."
        action={(j) => ({ to: `/jobs/${j.id}/repair`, label: `Verify and sign off${j.proposedPart ? ` ${j.proposedPart}` : ''}` })}
      />
      <JobsSection
        id="queue-h"
        title="Review queue"
        jobs={jobs}
        label="the review queue"
        empty="No diagnosis is waiting for review."
        action={(j) => ({ to: `/jobs/${j.id}/review`, label: `Review${j.proposedPart ? ` ${j.proposedPart}` : ''}` })}
      />
    </>
  );
}

function AdminHome() {
  const jobs = useJobs();
  return (
    <section aria-labelledby="shop-h" className="space-y-3">
      <h2 id="shop-h" className="text-xl font-semibold">
        The shop
      </h2>
      <QueryState query={jobs} label="the shop's jobs">
        {(d) => (
          <ul className="grid grid-cols-2 gap-2 sm:grid-cols-4 lg:grid-cols-7">
            {jobStatuses.map((s) => (
              <li key={s} className="rounded-lg border border-stone-300 bg-white p-3">
                <p className="text-sm text-stone-700">{jobStatusLabels[s]}</p>
                <p className="text-2xl font-semibold tabular-nums">{d.items.filter((j) => j.status === s).length}</p>
              </li>
            ))}
          </ul>
        )}
      </QueryState>
      <div className="flex flex-wrap gap-2">
        <Link to="/jobs" className="inline-flex min-h-11 items-center rounded-md bg-board px-4 font-semibold text-white">
          All jobs
        </Link>
        <Link to="/boards" className="inline-flex min-h-11 items-center rounded-md border border-stone-400 bg-white px-4 font-semibold">
          Board library
        </Link>
      </div>
    </section>
  );
}

const HOMES: Record<Me['role'], () => React.JSX.Element> = { admin: AdminHome, lead: LeadHome, tech: TechHome, trainee: TraineeHome };

export function HomePage() {
  const me = useMe();
  if (!me.data) return null;
  const Home = HOMES[me.data.role];
  return (
    <div className="space-y-4">
      <h1 className="text-2xl font-semibold">Welcome, {me.data.name}</h1>
      <Home />
    </div>
  );
}
