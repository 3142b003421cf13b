import type { CreateReadingRequest, CreateReadingResponse } from '@splitscope/contract';
import { useQueryClient } from '@tanstack/react-query';
import { useCallback, useEffect, useRef, useState } from 'react';
import { afterReadingWritten } from '@/lib/after-reading-written';
import { createReading } from '@/lib/api/create-reading';
import { ApiError } from '@/lib/api-client';
import { enqueueUnsent, flushUnsent, loadUnsent, type KeyValueStore, type UnsentEntry } from '@/lib/unsent-queue';

type Body = Omit<CreateReadingRequest, 'idempotencyKey'>;
export type UnsentReading = UnsentEntry<CreateReadingRequest>;

const store: KeyValueStore = {
  getItem: (k) => {
    try {
      return window.localStorage.getItem(k);
    } catch {
      return null;
    }
  },
  setItem: (k, v) => {
    try {
      window.localStorage.setItem(k, v);
    } catch {
      // storage full or blocked: the reading still goes out now, it just cannot survive a reload
    }
  },
};

const newKey = () => (typeof crypto !== 'undefined' && 'randomUUID' in crypto ? crypto.randomUUID() : `r-${Date.now()}-${Math.random().toString(36).slice(2)}`);

/**
 * Optimistic reading entry: every reading is written to the device first, then sent; while the network is down it
 * stays listed as unsent and is re-sent (same idempotency key) when the browser is back online or every 15 s.
 */
export function useReadingSender(jobId: string) {
  const qc = useQueryClient();
  const [unsent, setUnsent] = useState<UnsentReading[]>(() => loadUnsent<CreateReadingRequest>(store).filter((e) => e.jobId === jobId));
  const [rejected, setRejected] = useState<{ raw: string; message: string }[]>([]);
  const [lastSaved, setLastSaved] = useState<CreateReadingResponse | null>(null);
  const running = useRef(false);
  const again = useRef(false);

  const refresh = useCallback(() => setUnsent(loadUnsent<CreateReadingRequest>(store).filter((e) => e.jobId === jobId)), [jobId]);

  const flush = useCallback(async (): Promise<void> => {
    // A call during a run (the browser comes back online while the last attempt is still failing) makes the run
    // go round once more, so the return of the network is never missed.
    again.current = true;
    if (running.current) return;
    running.current = true;
    try {
      while (again.current) {
        again.current = false;
        const r = await flushUnsent<CreateReadingRequest>(store, jobId, async (e) => {
          try {
            setLastSaved(await createReading(jobId, e.body));
            return 'sent';
          } catch (err) {
            if (err instanceof ApiError && (err.isNetwork || err.status >= 500 || err.status === 429)) return 'retry';
            return { outcome: 'rejected', message: err instanceof Error ? err.message : 'refused' };
          }
        });
        if (r.rejected.length) setRejected((old) => [...old, ...r.rejected.map((x) => ({ raw: x.entry.body.raw, message: x.message }))]);
        if (r.sent.length) {
          // Stored: no longer listed as unsent while the readings and the (slower) diagnosis are fetched again.
          refresh();
          await afterReadingWritten(qc, jobId);
        }
      }
    } finally {
      running.current = false;
      refresh();
    }
  }, [jobId, qc, refresh]);

  useEffect(() => {
    const online = () => void flush();
    window.addEventListener('online', online);
    void flush();
    return () => window.removeEventListener('online', online);
  }, [flush]);

  useEffect(() => {
    if (unsent.length === 0) return;
    const t = window.setInterval(() => void flush(), 15_000);
    return () => window.clearInterval(t);
  }, [unsent.length, flush]);

  const save = useCallback(
    async (body: Body) => {
      const key = newKey();
      enqueueUnsent<CreateReadingRequest>(store, {
        key,
        jobId,
        body: { ...body, idempotencyKey: key, takenAt: new Date().toISOString() },
        createdAt: new Date().toISOString(),
      });
      refresh();
      await flush();
      return key;
    },
    [jobId, flush, refresh],
  );

  return { save, flush, unsent, rejected, lastSaved, dismissRejected: () => setRejected([]) };
}
