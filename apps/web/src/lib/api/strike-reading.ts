import { readingSchema } from '@splitscope/contract';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { afterReadingWritten } from '@/lib/after-reading-written';
import { api } from '@/lib/api-client';

/** Strikes a reading out with a reason; the reading stays listed and stops counting. */
export const strikeReading = (jobId: string, readingId: string, reason: string) =>
  api(`/jobs/${encodeURIComponent(jobId)}/readings/${encodeURIComponent(readingId)}/strike`, {
    method: 'POST',
    body: JSON.stringify({ reason }),
    schema: readingSchema,
  });

export const useStrikeReading = (jobId: string) => {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ readingId, reason }: { readingId: string; reason: string }) => strikeReading(jobId, readingId, reason),
    onSuccess: () => afterReadingWritten(qc, jobId),
  });
};
