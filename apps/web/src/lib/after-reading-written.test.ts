// The bench's ranking after a reading: a diagnosis still on its first load when the reading is saved must not
// be taken as the answer for the new reading (the part-alone reading on a board with no fault dictionary).
import { QueryClient, QueryObserver } from '@tanstack/react-query';
import { describe, expect, it } from 'vitest';
import { afterReadingWritten } from './after-reading-written';

const jobId = 'job-1';

/** A server whose diagnosis answers, slowly, for the readings stored when it was asked. */
function slowServer() {
  let stored = 1;
  const asked: number[] = [];
  const diagnosis = async () => {
    const n = stored;
    asked.push(n);
    await new Promise((r) => setTimeout(r, 50));
    return { readings: n };
  };
  return { asked, diagnosis, save: () => void (stored += 1) };
}

function watch(qc: QueryClient, queryKey: string[], queryFn: () => Promise<{ readings: number }>) {
  const observer = new QueryObserver(qc, { queryKey, queryFn, retry: false });
  // Each answer shown, in order (a notification that changes only the fetch state is not a new answer).
  const seen: number[] = [];
  const stop = observer.subscribe((r) => void (r.data && r.data.readings !== seen.at(-1) && seen.push(r.data.readings)));
  return { observer, seen, stop };
}

describe('afterReadingWritten', () => {
  it('asks for the diagnosis again when the reading lands while the first diagnosis is still loading', async () => {
    const qc = new QueryClient();
    const server = slowServer();
    const d = watch(qc, ['jobs', jobId, 'diagnosis'], server.diagnosis);
    const r = watch(qc, ['jobs', jobId, 'readings'], server.diagnosis);
    await new Promise((res) => setTimeout(res, 10)); // both first loads are under way, with no data yet
    server.save();
    await afterReadingWritten(qc, jobId);
    expect(d.observer.getCurrentResult().data).toEqual({ readings: 2 });
    expect(r.observer.getCurrentResult().data).toEqual({ readings: 2 });
    // The answer for the readings before the save was never shown as the ranking.
    expect(d.seen).not.toContain(1);
    d.stop();
    r.stop();
    qc.clear();
  });

  it('asks again when the diagnosis already has an answer', async () => {
    const qc = new QueryClient();
    const server = slowServer();
    const d = watch(qc, ['jobs', jobId, 'diagnosis'], server.diagnosis);
    await qc.fetchQuery({ queryKey: ['jobs', jobId, 'diagnosis'], queryFn: server.diagnosis });
    server.save();
    await afterReadingWritten(qc, jobId);
    expect(d.observer.getCurrentResult().data).toEqual({ readings: 2 });
    expect(d.seen).toEqual([1, 2]);
    d.stop();
    qc.clear();
  });
});
