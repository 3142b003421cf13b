import type { ReactNode } from 'react';

interface QueryLike<T> {
  isPending: boolean;
  isError: boolean;
  error: Error | null;
  data: T | undefined;
  refetch: () => unknown;
}

/** Loading and error states for one query, so no screen shows a blank while it waits or after it fails. */
export function QueryState<T>({ query, label, children }: { query: QueryLike<T>; label: string; children: (data: T) => ReactNode }) {
  if (query.isPending)
    return (
      <p role="status" className="p-4 text-stone-700">
        Loading {label}…
      </p>
    );
  if (query.isError || query.data === undefined)
    return (
      <div role="alert" className="flex flex-wrap items-center gap-3 rounded-md border border-red-300 bg-red-50 p-3 text-high">
        <span>
          Could not load {label}: {query.error?.message ?? 'no data'}
        </span>
        <button type="button" className="min-h-11 rounded-md border border-high px-3 font-semibold" onClick={() => query.refetch()}>
          Try again
        </button>
      </div>
    );
  return <>{children(query.data)}</>;
}
