import { Link } from 'react-router-dom';
import { PageHeader } from '@/components/ui/page-header';
import { QueryState } from '@/components/ui/query-state';
import { useJobs } from '@/lib/api/get-jobs';
import { age } from '@/lib/format';

function ReviewQueuePage() {
  const jobs = useJobs({ status: 'awaiting-review' });
  return (
    <section>
      <PageHeader title="Review queue">
        <Link className="inline-flex min-h-11 items-center text-board underline" to="/stats">
          Shop statistics
        </Link>
      </PageHeader>
      <QueryState query={jobs} label="the review queue">
        {(d) =>
          d.items.length === 0 ? (
            <p className="text-stone-700">No diagnosis is waiting for review.</p>
          ) : (
            <table className="w-full rounded-lg border border-stone-300 bg-white text-left">
              <thead className="bg-stone-100 text-sm">
                <tr>
                  <th className="p-2">Job</th>
                  <th className="hidden sm:table-cell">Board</th>
                  <th className="hidden sm:table-cell">Customer</th>
                  <th className="pr-2">Proposed part</th>
                  <th className="pr-2">Technician</th>
                  <th className="pr-2">Waiting</th>
                </tr>
              </thead>
              <tbody>
                {d.items.map((j) => (
                  <tr key={j.id} className="border-t border-stone-200">
                    <td className="p-1">
                      <Link className="inline-flex min-h-11 items-center px-1 font-semibold text-board underline" to={`/jobs/${j.id}/review`}>
                        Review #{j.number}
                      </Link>
                    </td>
                    {/* A phone shows what a lead decides on: the job, the part and who waits; board and customer open with the job. */}
                    <td className="hidden sm:table-cell">{j.boardName}</td>
                    <td className="hidden sm:table-cell">{j.customerName}</td>
                    <td className="pr-2 font-semibold">{j.proposedPart ?? '—'}</td>
                    <td className="pr-2">{j.assigneeName ?? '—'}</td>
                    <td className="pr-2">{age(j.updatedAt)}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          )
        }
      </QueryState>
    </section>
  );
}

export default ReviewQueuePage;
