// An open-loop load: requests leave at fixed times whatever the server does, as a shop's technicians would go on
// taking readings while a server is slow. Each technician posts a reading every `periodMs` (the technicians'
// start times spread evenly over one period) and reads the diagnosis once the reading is acknowledged.
// A write's time is counted from when it was due, not from when the timer fired or a connection was free, so a
// stall of the client or the server shows in the figures instead of thinning the load (coordinated omission).
import { randomUUID } from 'node:crypto';
import type { CreateReadingRequest } from '../../packages/contract/src/index';
import { percentile } from './env';
import { readingsPath } from './target';

export interface Technician {
  cookie: string;
  jobId: string;
}

export interface OpenLoopOptions {
  baseUrl: string;
  technicians: Technician[];
  periodMs: number;
  seconds: number;
  body: (i: number, key: string) => CreateReadingRequest;
  /** Called once, `atMs` after the start (the scale-out run kills a server there). */
  midway?: { atMs: number; run: () => Promise<void> };
  timeoutMs?: number;
}

export interface KindFigures {
  kind: string;
  requests: number;
  perSecond: number;
  p50: number;
  p95: number;
  p99: number;
  max: number;
  errors: number;
  /** Error answers by status (or `network`, `timeout`). */
  errorKinds: Record<string, number>;
}

export interface OpenLoopResult {
  writes: KindFigures;
  reads: KindFigures;
  /** Idempotency keys of the readings the server acknowledged with 201. */
  acknowledged: string[];
  seconds: number;
}

class Tally {
  times: number[] = [];
  errorKinds: Record<string, number> = {};
  add(ms: number) {
    this.times.push(ms);
  }
  fail(kind: string) {
    this.errorKinds[kind] = (this.errorKinds[kind] ?? 0) + 1;
  }
  figures(kind: string, seconds: number): KindFigures {
    const sorted = [...this.times].sort((a, b) => a - b);
    const errors = Object.values(this.errorKinds).reduce((a, b) => a + b, 0);
    return {
      kind,
      requests: sorted.length + errors,
      perSecond: (sorted.length + errors) / seconds,
      p50: percentile(sorted, 50),
      p95: percentile(sorted, 95),
      p99: percentile(sorted, 99),
      max: sorted[sorted.length - 1] ?? NaN,
      errors,
      errorKinds: this.errorKinds,
    };
  }
}

const failure = (err: unknown) => ((err as Error).name === 'TimeoutError' ? 'timeout' : 'network');

export async function openLoop(o: OpenLoopOptions): Promise<OpenLoopResult> {
  const writes = new Tally();
  const reads = new Tally();
  const acknowledged: string[] = [];
  const timeoutMs = o.timeoutMs ?? 10_000;
  const start = performance.now() + 200;
  const end = start + o.seconds * 1000;
  const inFlight = new Set<Promise<void>>();
  let counter = 0;

  // One technician's cycle: the write measured from its due time, then the read from when it was sent.
  const cycle = async (t: Technician, due: number) => {
    const key = randomUUID();
    const headers = { cookie: t.cookie, 'content-type': 'application/json' };
    try {
      const r = await fetch(o.baseUrl + readingsPath(t.jobId), {
        method: 'POST',
        headers,
        body: JSON.stringify(o.body(counter++, key)),
        signal: AbortSignal.timeout(timeoutMs),
      });
      await r.arrayBuffer();
      if (r.status !== 201) return writes.fail(String(r.status));
      writes.add(performance.now() - due);
      acknowledged.push(key);
    } catch (err) {
      return writes.fail(failure(err));
    }
    const sent = performance.now();
    try {
      const r = await fetch(`${o.baseUrl}/api/jobs/${encodeURIComponent(t.jobId)}/diagnosis`, { headers, signal: AbortSignal.timeout(timeoutMs) });
      await r.arrayBuffer();
      if (r.status !== 200) return reads.fail(String(r.status));
      reads.add(performance.now() - sent);
    } catch (err) {
      reads.fail(failure(err));
    }
  };

  const n = o.technicians.length;
  const timers = o.technicians.map((t, k) => {
    let due = start + (k / n) * o.periodMs;
    const fire = () => {
      if (due >= end) return;
      const p = cycle(t, due).finally(() => inFlight.delete(p));
      inFlight.add(p);
      due += o.periodMs;
      timer = setTimeout(fire, Math.max(0, due - performance.now()));
    };
    let timer = setTimeout(fire, Math.max(0, due - performance.now()));
    return () => clearTimeout(timer);
  });
  let midway: Promise<void> | undefined;
  const midTimer = o.midway && setTimeout(() => void (midway = o.midway!.run()), o.midway.atMs + 200);
  await new Promise((r) => setTimeout(r, end - performance.now()));
  for (const stop of timers) stop();
  if (midTimer) clearTimeout(midTimer);
  await midway;
  await Promise.all([...inFlight]);
  return { writes: writes.figures('POST reading', o.seconds), reads: reads.figures('GET diagnosis', o.seconds), acknowledged, seconds: o.seconds };
}
