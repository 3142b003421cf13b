// The bench-meter requests of this server process, per person: at most one waiting at a time (a new one replaces
// it), and the last one of each job kept for the bench page to show how it ended. They are held in memory: a
// request is a moment at the bench, not a record (the reading it produces is the record), and after a restart
// the bench simply asks again.
import { EventEmitter } from 'node:events';
import type { BenchMeterArm, StoredReading } from '@splitscope/contract';

export interface Arm extends Omit<BenchMeterArm, 'reading' | 'refusal' | 'state' | 'ready'> {
  ready: boolean;
  userId: string;
  shopId: string;
  state: BenchMeterArm['state'];
  reading: StoredReading | null;
  refusal: string | null;
  safetyCheck?: { unplugged: true; busVolts: number };
}

/** A bridge is shown as connected while it asked for work within this time (it asks again every 20 s at most). */
const CONNECTED_MS = 35_000;

export class MeterDesk {
  private readonly waiting = new Map<string, Arm>();
  private readonly lastOfJob = new Map<string, Arm>();
  private readonly bridges = new Map<string, { instrument: string | null; seenAt: Date }>();
  private readonly changes = new EventEmitter().setMaxListeners(0);

  private static jobKey = (userId: string, jobId: string) => `${userId}|${jobId}`;

  arm(a: Arm): void {
    const before = this.waiting.get(a.userId);
    if (before) before.state = 'cancelled';
    this.waiting.set(a.userId, a);
    this.lastOfJob.set(MeterDesk.jobKey(a.userId, a.jobId), a);
    this.changes.emit(a.userId);
  }

  cancel(userId: string, jobId: string): Arm | undefined {
    const a = this.waiting.get(userId);
    if (!a || a.jobId !== jobId) return undefined;
    a.state = 'cancelled';
    this.waiting.delete(userId);
    this.changes.emit(userId);
    return a;
  }

  /** Ends a waiting request with the stored reading or the refusal; it is no longer served. */
  settle(a: Arm, outcome: { reading: StoredReading } | { refusal: string }): void {
    if ('reading' in outcome) Object.assign(a, { state: 'taken', reading: outcome.reading, refusal: null });
    else Object.assign(a, { state: 'refused', refusal: outcome.refusal });
    if (this.waiting.get(a.userId) === a) this.waiting.delete(a.userId);
    this.changes.emit(a.userId);
  }

  /** The request with this id, waiting or ended, if it is this person's latest on its job. */
  find(userId: string, armId: string): Arm | undefined {
    const w = this.waiting.get(userId);
    if (w?.id === armId) return w;
    for (const a of this.lastOfJob.values()) if (a.id === armId && a.userId === userId) return a;
    return undefined;
  }

  latestOnJob(userId: string, jobId: string): Arm | undefined {
    return this.lastOfJob.get(MeterDesk.jobKey(userId, jobId));
  }

  seen(userId: string, instrument: string | undefined): void {
    const before = this.bridges.get(userId);
    this.bridges.set(userId, { instrument: instrument ?? before?.instrument ?? null, seenAt: new Date() });
  }

  bridgeOf(userId: string, now = Date.now()) {
    const b = this.bridges.get(userId);
    return b ? { ...b, connected: now - b.seenAt.getTime() < CONNECTED_MS } : null;
  }

  /**
   * The person's waiting request, answered at once when it is not `after` (the one the bridge already serves),
   * else when anything changes or after `waitMs`: a long poll, so the bridge hears of a new or cancelled request
   * at once without polling fast. Null: nothing is waiting.
   */
  async next(userId: string, after: string | undefined, waitMs: number, signal: AbortSignal): Promise<Arm | null> {
    const current = () => this.waiting.get(userId) ?? null;
    const now = current();
    if ((now && now.id !== after) || waitMs === 0) return now;
    return new Promise((resolve) => {
      const done = () => {
        clearTimeout(timer);
        this.changes.off(userId, done);
        signal.removeEventListener('abort', done);
        resolve(current());
      };
      const timer = setTimeout(done, waitMs);
      this.changes.on(userId, done);
      signal.addEventListener('abort', done);
    });
  }
}
