// The bridge's loop: wait for the bench's request, set the meter up for it, read when the technician presses the
// meter's trigger (or at once), send the answer. A new request or a cancel on the bench ends the one in hand.
import { readScpiNumber, type BenchMeterJob } from '@splitscope/contract';
import { QueryAborted, type ScpiMeter } from './scpi-meter';
import type { ServerLink } from './server-link';

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

interface Serving {
  id: string;
  stop(): Promise<void>;
  done: Promise<void>;
}

export interface BridgeOptions {
  meter: ScpiMeter;
  link: ServerLink;
  log: (line: string) => void;
  signal: AbortSignal;
}

/** Asks the meter who it is (*IDN?): a port with no SCPI meter on it stops the bridge here, before any request. */
export async function identify(meter: ScpiMeter): Promise<string> {
  const idn = await meter.query('*IDN?', 3000);
  if (!idn) throw new Error('the meter answered *IDN? with an empty line');
  return idn;
}

async function sendAnswer(o: BridgeOptions, job: BenchMeterJob, answer: string, idn: string): Promise<void> {
  const shown = readScpiNumber(answer);
  o.log(`${job.label}: the meter read ${answer}${shown.ok && shown.value === 'OL' ? ' (overload, OL)' : ''}`);
  // The server or the network may be down for a moment: the same answer goes again (the server stores it once).
  for (let attempt = 1; attempt <= 10 && !o.signal.aborted; attempt++) {
    const r = await o.link.send(job.id, answer, idn);
    if (r.ok) return o.log(`${job.label}: stored on the bench`);
    if (!r.retry) return o.log(`${job.label}: not stored: ${r.message}`);
    o.log(`${job.label}: ${r.message}; sending again`);
    await sleep(Math.min(500 * attempt, 3000));
  }
}

function serve(o: BridgeOptions, job: BenchMeterJob, idn: string): Serving {
  let stopped = false;
  const done = (async () => {
    try {
      await o.meter.send(job.configure);
      await o.meter.send(job.triggerSource);
      o.log(job.trigger === 'meter' ? `${job.label}: press the meter's trigger` : `${job.label}: reading now`);
      const answer = await o.meter.query('READ?', job.trigger === 'now' ? 10_000 : null);
      if (!stopped) await sendAnswer(o, job, answer, idn);
    } catch (err) {
      if (err instanceof QueryAborted) return;
      o.log(`${job.label}: ${(err as Error).message}`);
    }
  })();
  return {
    id: job.id,
    done,
    stop: async () => {
      stopped = true;
      if (o.meter.waiting) {
        o.log(`${job.label}: cancelled on the bench`);
        await o.meter.abort();
      }
      await done;
    },
  };
}

/** Runs until `signal` aborts. The meter is identified first; then requests are served one at a time. */
export async function runBridge(o: BridgeOptions): Promise<void> {
  const idn = await identify(o.meter);
  o.log(`meter: ${idn}`);
  let current: Serving | null = null;
  while (!o.signal.aborted) {
    let job: BenchMeterJob | null;
    try {
      job = await o.link.next(current?.id, idn, o.signal);
    } catch (err) {
      if (o.signal.aborted) break;
      o.log(`server: ${(err as Error).message}; asking again in 2 s`);
      await sleep(2000);
      continue;
    }
    if (current && job?.id !== current.id) {
      await current.stop();
      current = null;
    }
    if (job && !current) {
      const started = serve(o, job, idn);
      current = started;
      // Once served, the request is finished here too; the next long poll starts from nothing in hand.
      void started.done.then(() => {
        if (current === started) current = null;
      });
    }
  }
  await current?.stop();
}
