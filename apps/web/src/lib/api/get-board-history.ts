import { boardHistoryResponse } from '@splitscope/contract';
import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

/** The earlier jobs of a board serial and/or a unit serial, and whether a board received now is a warranty return. */
export const getBoardHistory = (q: { serial?: string; unitSerial?: string }) => {
  const params = new URLSearchParams();
  if (q.serial) params.set('serial', q.serial);
  if (q.unitSerial) params.set('unitSerial', q.unitSerial);
  return api(`/board-history?${params}`, { schema: boardHistoryResponse });
};

/** Serials shorter than this are still being typed: no lookup yet. */
const MIN_SERIAL = 3;

export const useBoardHistory = (q: { serial?: string; unitSerial?: string }) => {
  const serial = (q.serial ?? '').trim();
  const unitSerial = (q.unitSerial ?? '').trim();
  const wanted = { serial: serial.length >= MIN_SERIAL ? serial : undefined, unitSerial: unitSerial.length >= MIN_SERIAL ? unitSerial : undefined };
  return useQuery(
    queryOptions({
      queryKey: ['board-history', wanted.serial ?? '', wanted.unitSerial ?? ''],
      queryFn: () => getBoardHistory(wanted),
      enabled: !!(wanted.serial || wanted.unitSerial),
      placeholderData: keepPreviousData,
    }),
  );
};

/** A job's earlier visits (by its board and unit serial) and its warranty flag, as of the day it was received. */
export const useJobHistory = (jobId: string) =>
  useQuery(
    queryOptions({ queryKey: ['jobs', jobId, 'history'], queryFn: () => api(`/jobs/${encodeURIComponent(jobId)}/history`, { schema: boardHistoryResponse }) }),
  );
