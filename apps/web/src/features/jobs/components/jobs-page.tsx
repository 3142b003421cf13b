import { jobStatusLabels, jobStatuses, type Job, type JobStatus } from '@splitscope/contract';
import {
  createColumnHelper,
  flexRender,
  getCoreRowModel,
  getFilteredRowModel,
  getSortedRowModel,
  useReactTable,
  type SortingState,
} from '@tanstack/react-table';
import { useMemo, useState } from 'react';
import { Link } from 'react-router-dom';
import { PageHeader } from '@/components/ui/page-header';
import { QueryState } from '@/components/ui/query-state';
import { StatusBadge } from '@/components/ui/status-badge';
import { useJobs } from '@/lib/api/get-jobs';
import { age } from '@/lib/format';

const col = createColumnHelper<Job>();

export function JobsTable({ jobs }: { jobs: Job[] }) {
  const [sorting, setSorting] = useState<SortingState>([{ id: 'age', desc: true }]);
  const [search, setSearch] = useState('');
  const [status, setStatus] = useState<JobStatus | ''>('');
  const rows = useMemo(() => (status ? jobs.filter((j) => j.status === status) : jobs), [jobs, status]);
  const columns = useMemo(
    () => [
      col.accessor('number', {
        header: 'Job',
        cell: (c) => (
          <Link className="inline-flex min-h-11 items-center font-semibold text-board underline" to={`/jobs/${c.row.original.id}`}>
            #{c.getValue()}
          </Link>
        ),
      }),
      col.accessor('status', { header: 'Status', cell: (c) => <StatusBadge status={c.getValue()} sentBack={c.row.original.sentBack} /> }),
      col.accessor('boardName', { header: 'Board' }),
      col.accessor('customerName', { header: 'Customer' }),
      col.accessor((j) => j.assigneeName ?? 'unassigned', { id: 'assignee', header: 'Assignee' }),
      col.accessor((j) => Date.parse(j.receivedAt), {
        id: 'age',
        header: 'Age',
        cell: (c) => age(c.row.original.receivedAt),
        enableGlobalFilter: false,
      }),
      col.accessor((j) => `${j.faultCode ?? ''} ${j.symptom} ${j.unitDescription} ${j.serial ?? ''}`, {
        id: 'fault',
        header: 'Fault',
        cell: (c) => (
          <span className="text-sm">
            {c.row.original.faultCode && <span className="mr-1 rounded bg-stone-200 px-1 font-mono">{c.row.original.faultCode}</span>}
            {c.row.original.symptom}
          </span>
        ),
        enableSorting: false,
      }),
    ],
    [],
  );
  const table = useReactTable({
    data: rows,
    columns,
    state: { sorting, globalFilter: search },
    onSortingChange: setSorting,
    onGlobalFilterChange: setSearch,
    globalFilterFn: 'includesString',
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
    getFilteredRowModel: getFilteredRowModel(),
  });

  return (
    <div className="space-y-3">
      <div className="flex flex-wrap items-end gap-3">
        <label className="block">
          <span className="block text-sm font-medium">Search</span>
          <input
            type="search"
            value={search}
            onChange={(e) => setSearch(e.target.value)}
            placeholder="customer, board, fault, serial"
            className="mt-1 min-h-11 w-72 max-w-full rounded-md border border-stone-500 px-3"
          />
        </label>
        <label className="block">
          <span className="block text-sm font-medium">Status</span>
          <select
            value={status}
            onChange={(e) => setStatus(e.target.value as JobStatus | '')}
            className="mt-1 min-h-11 rounded-md border border-stone-500 bg-white px-3"
          >
            <option value="">All statuses</option>
            {jobStatuses.map((s) => (
              <option key={s} value={s}>
                {jobStatusLabels[s]}
              </option>
            ))}
          </select>
        </label>
        <p className="pb-3 text-sm text-stone-700" aria-live="polite">
          {table.getRowModel().rows.length} of {jobs.length} jobs
        </p>
      </div>
      <div className="overflow-x-auto rounded-lg border border-stone-300 bg-white">
        <table className="w-full text-left">
          <thead className="bg-stone-100">
            {table.getHeaderGroups().map((hg) => (
              <tr key={hg.id}>
                {hg.headers.map((h) => {
                  const sorted = h.column.getIsSorted();
                  return (
                    <th
                      key={h.id}
                      scope="col"
                      className="px-2 text-sm"
                      aria-sort={sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : undefined}
                    >
                      {h.column.getCanSort() ? (
                        <button type="button" className="flex min-h-11 items-center gap-1 font-semibold" onClick={h.column.getToggleSortingHandler()}>
                          {flexRender(h.column.columnDef.header, h.getContext())}
                          <span aria-hidden>{sorted === 'asc' ? '▲' : sorted === 'desc' ? '▼' : '↕'}</span>
                        </button>
                      ) : (
                        flexRender(h.column.columnDef.header, h.getContext())
                      )}
                    </th>
                  );
                })}
              </tr>
            ))}
          </thead>
          <tbody>
            {table.getRowModel().rows.map((r) => (
              <tr key={r.id} className="border-t border-stone-200">
                {r.getVisibleCells().map((c) => (
                  <td key={c.id} className="px-2 py-1">
                    {flexRender(c.column.columnDef.cell, c.getContext())}
                  </td>
                ))}
              </tr>
            ))}
            {table.getRowModel().rows.length === 0 && (
              <tr>
                <td colSpan={columns.length} className="p-4 text-stone-700">
                  No jobs match.
                </td>
              </tr>
            )}
          </tbody>
        </table>
      </div>
    </div>
  );
}

function JobsPage() {
  const jobs = useJobs();
  return (
    <section>
      <PageHeader title="Jobs">
        <Link to="/history" className="inline-flex min-h-11 items-center rounded-md border border-board px-4 font-semibold text-board">
          Board history by serial
        </Link>
        <Link to="/parts-bin" className="inline-flex min-h-11 items-center rounded-md border border-board px-4 font-semibold text-board">
          Parts bin
        </Link>
        <Link to="/jobs/new" className="inline-flex min-h-11 items-center rounded-md bg-board px-4 font-semibold text-white">
          Open a job
        </Link>
      </PageHeader>
      <QueryState query={jobs} label="jobs">
        {(d) => <JobsTable jobs={d.items} />}
      </QueryState>
    </section>
  );
}

export default JobsPage;
