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

function TechHome() {
  const jobs = useJobs({ assignee: 'me', status: OPEN.join(',') });
  return (
    <section aria-labelledby="mine-h" className="space-y-2">
      <h2 id="mine-h" className="text-xl font-semibold">
        My open jobs
      </h2>
      <QueryState query={jobs} label="your jobs">
        {(d) => (
          <JobCards
            jobs={d.items}
            empty="No open jobs are assigned to you."
            action={(j) =>
              j.status === 'approved'
                ? { to: `/jobs/${j.id}/repair`, label: 'Record the repair' }
                : j.status === 'repaired'
                  ? { to: `/jobs/${j.id}/repair`, label: 'Verify the board' }
                  : { to: `/jobs/${j.id}`, label: 'Open the bench' }
            }
          />
        )}
      </QueryState>
    </section>
  );
}

function TraineeHome() {
  const jobs = useJobs({ assignee: 'me', status: 'received,diagnosing' });
  return (
    <section aria-labelledby="steps-h" className="space-y-2">
      <h2 id="steps-h" className="text-xl font-semibold">
        My assigned steps
      </h2>
      <p className="text-sm text-stone-700">Each job opens in guided order: one step at a time, with the safety gates.</p>
      <QueryState query={jobs} label="your assigned jobs">
        {(d) => (
          <JobCards
            jobs={d.items}
            empty="Nothing is assigned to you right now."
            action={(j) => ({ to: `/jobs/${j.id}?mode=guided`, label: 'Continue the guided order' })}
          />
        )}
      </QueryState>
    </section>
  );
}

function LeadHome() {
  const jobs = useJobs({ status: 'awaiting-review' });
  const signOff = useJobs({ status: 'repaired' });
  return (
    <>
      <section aria-labelledby="signoff-h" className="space-y-2">
        <h2 id="signoff-h" className="text-xl font-semibold">
          Repairs waiting for your sign-off
        </h2>
        <QueryState query={signOff} label="the repairs waiting for sign-off">
          {(d) => (
            <JobCards
              jobs={d.items}
              empty="No repaired board is waiting for sign-off."
              action={(j) => ({ to: `/jobs/${j.id}/repair`, label: `Verify and sign off${j.proposedPart ? ` ${j.proposedPart}` : ''}` })}
            />
          )}
        </QueryState>
      </section>
      <section aria-labelledby="queue-h" className="space-y-2">
        <h2 id="queue-h" className="text-xl font-semibold">
          Review queue
        </h2>
        <QueryState query={jobs} label="the review queue">
          {(d) => (
            <JobCards
              jobs={d.items}
              empty="No diagnosis is waiting for review."
              action={(j) => ({ to: `/jobs/${j.id}/review`, label: `Review${j.proposedPart ? ` ${j.proposedPart}` : ''}` })}
            />
          )}
        </QueryState>
      </section>
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
