// The meter's side of the bridge: SCPI commands out, one answer line per query back, in order.
import type { SerialLines } from './serial-lines';

export class QueryAborted extends Error {
  constructor() {
    super('the query was aborted');
  }
}

interface Pending {
  command: string;
  resolve: (answer: string) => void;
  reject: (err: Error) => void;
  timer?: NodeJS.Timeout;
}

/**
 * Queries are answered in the order they were sent (IEEE 488.2 has one output queue), so each answer line goes to
 * the oldest open query. A READ? that waits for the meter's trigger has no time limit; `abort` gives it up and
 * sends ABORt, and drops any answer that still comes in the next moment rather than give it to the next query.
 */
export class ScpiMeter {
  private readonly pending: Pending[] = [];
  private dropping = false;

  constructor(private readonly lines: SerialLines) {
    lines.onLine((line) => {
      if (this.dropping) return; // a late answer to an aborted query
      const p = this.pending.shift();
      if (!p) return; // noise on the line, or an answer after its query timed out
      if (p.timer) clearTimeout(p.timer);
      p.resolve(line.trim());
    });
  }

  send(command: string): Promise<void> {
    return this.lines.write(command);
  }

  /** Sends a query and resolves with its answer; `timeoutMs` null waits as long as it takes (a trigger). */
  async query(command: string, timeoutMs: number | null): Promise<string> {
    const answer = new Promise<string>((resolve, reject) => {
      const p: Pending = { command, resolve, reject };
      if (timeoutMs !== null) {
        p.timer = setTimeout(() => {
          this.pending.splice(this.pending.indexOf(p), 1);
          reject(new Error(`the meter did not answer ${command} within ${timeoutMs / 1000} s`));
        }, timeoutMs);
      }
      this.pending.push(p);
    });
    await this.lines.write(command);
    return answer;
  }

  get waiting(): boolean {
    return this.pending.length > 0;
  }

  /** Gives up every open query (the bench cancelled the request) and stops the meter's measurement. */
  async abort(): Promise<void> {
    for (const p of this.pending.splice(0)) {
      if (p.timer) clearTimeout(p.timer);
      p.reject(new QueryAborted());
    }
    this.dropping = true;
    try {
      await this.lines.write('ABOR');
      await new Promise((r) => setTimeout(r, 300));
    } finally {
      this.dropping = false;
    }
  }

  close(): Promise<void> {
    return this.lines.close();
  }
}
