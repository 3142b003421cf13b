import { Link } from 'react-router-dom';
import { PageHeader } from '@/components/ui/page-header';
import { QueryState } from '@/components/ui/query-state';
import { dateTime } from '@/lib/format';
import { useBoards } from '@/lib/api/get-boards';

function BoardLibraryPage() {
  const boards = useBoards();
  return (
    <section>
      <PageHeader title="Board library" />
      <QueryState query={boards} label="the board library">
        {(d) => (
          <ul className="grid gap-3 md:grid-cols-2">
            {d.items.map((b) => (
              <li key={b.id} className="rounded-lg border border-stone-300 bg-white p-3">
                <p className="font-semibold">{b.name}</p>
                <p className="text-sm text-stone-700">
                  {b.key} · version {b.version} · updated {dateTime(b.updatedAt)}
                </p>
                <Link to={`/boards/${b.id}`} className="mt-2 inline-flex min-h-11 items-center rounded-md bg-board px-4 font-semibold text-white">
                  Open the editor
                </Link>
              </li>
            ))}
            {d.items.length === 0 && <li className="text-stone-700">No board models yet.</li>}
          </ul>
        )}
      </QueryState>
    </section>
  );
}

export default BoardLibraryPage;
