import type { QueryClient } from '@tanstack/react-query';

/**
 * A job's readings and ranking asked for again after a reading was saved, corrected or struck. A query that is
 * still on its first load when the write lands (a first diagnosis of a board can take many seconds) is cancelled
 * and asked again: TanStack Query's invalidation joins the fetch of a query that has no data yet instead of
 * starting a new one, and that fetch answers for the readings from before the write, then stays fresh.
 */
export async function afterReadingWritten(qc: QueryClient, jobId: string): Promise<void> {
  await Promise.all(
    (['readings', 'diagnosis'] as const).map(async (what) => {
      const queryKey = ['jobs', jobId, what];
      await qc.cancelQueries({ queryKey });
      await qc.invalidateQueries({ queryKey });
    }),
  );
}
