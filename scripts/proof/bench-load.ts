// The load a shop makes, open loop: 300 technicians each post a reading every 3 s and read the diagnosis after
// each (~200 requests/s), on a database of this run's own with the shop cluster's durable settings. With
// `servers: 2` two server processes share that PostgreSQL behind HAProxy (sessions and fault dictionaries live
// in the database, so either process answers any technician), and with `kill` one of them is SIGKILLed halfway:
// every reading acknowledged with 201 must then be in the database.
import pg from 'pg';
import { removeCluster } from '../lib/pg';
import { DEMO_BOARD_IDS, JOB_DEFAULTS } from '../../apps/server/src/testing/requests';
import { Balancer, ensureHaproxy } from './balancer';
import { loadAverage, machineSize, proofClusterSpec, proofDatabase, ServerChild, signIn, sleep, type Session } from './env';
import { openLoop, type KindFigures, type Technician } from './open-loop';
import { readingTarget } from './target';

export interface LoadOptions {
  technicians: number;
  periodMs: number;
  seconds: number;
  servers: 1 | 2;
  kill: boolean;
  log: (line: string) => void;
}

export interface LoadReport {
  options: Omit<LoadOptions, 'log'>;
  writes: KindFigures;
  reads: KindFigures;
  acknowledged: number;
  stored: number;
  /** Seconds until the demo board's fault dictionary was ready (the run waits for it). */
  dictionaryWait: number;
  machine: string;
  load: string;
  ok: boolean;
}

/** Targets from the issue, at 200 requests/s: write p99 < 25 ms, diagnosis read p99 < 50 ms, no errors. */
export const LOAD_TARGETS = { writeP99Ms: 25, readP99Ms: 50 };
/** Sessions the technicians share: signing in 300 times would measure the password hash, not the bench. */
const SESSIONS = 10;

async function post<T>(url: string, session: Session, body: unknown): Promise<T> {
  const r = await fetch(url, { method: 'POST', headers: { cookie: session.cookie, 'content-type': 'application/json' }, body: JSON.stringify(body) });
  if (r.status !== 201) throw new Error(`POST ${url} answered ${r.status}: ${await r.text()}`);
  return (await r.json()) as T;
}

/** Until the demo board's dictionary is built (a fresh database builds it at start), diagnoses simulate. */
export async function waitForDictionary(baseUrl: string, session: Session, jobId: string, log: (l: string) => void): Promise<number> {
  const t0 = Date.now();
  for (;;) {
    const r = await fetch(`${baseUrl}/api/jobs/${encodeURIComponent(jobId)}/diagnosis`, { headers: { cookie: session.cookie } });
    const body = (await r.json()) as { preparing?: { partsDone: number; partsTotal: number } };
    if (r.ok && !body.preparing) return (Date.now() - t0) / 1000;
    if (Date.now() - t0 > 15 * 60_000) throw new Error('the demo board’s fault dictionary was not ready within 15 minutes');
    if (body.preparing) log(`bench:load: fault dictionary ${body.preparing.partsDone}/${body.preparing.partsTotal} parts`);
    await sleep(5000);
  }
}

export async function runLoadBench(opts: LoadOptions): Promise<LoadReport> {
  const { log } = opts;
  if (opts.servers === 2) ensureHaproxy();
  const spec = proofClusterSpec('pg-bench');
  const servers: ServerChild[] = [];
  let balancer: Balancer | null = null;
  const cleanUp = async () => {
    await balancer?.stop();
    for (const s of servers) await s.kill('SIGKILL');
    removeCluster(spec);
  };
  const onSignal = () => void cleanUp().finally(() => process.exit(130));
  process.once('SIGINT', onSignal);
  process.once('SIGTERM', onSignal);
  try {
    const db = await proofDatabase(spec, 'splitscope_load');
    // One after another: each takes the first free port from the same base.
    for (let i = 0; i < opts.servers; i++) {
      const s = await ServerChild.create(db.url, `bench-load-server-${i + 1}.log`, { LOCAL_FAKES: '0' });
      await s.start();
      servers.push(s);
    }
    if (opts.servers === 2) balancer = await Balancer.start(servers.map((s) => s.url));
    const baseUrl = balancer?.url ?? servers[0]!.url;
    // Behind the balancer consecutive sign-ins land on different servers: each session is used on both.
    const sessions: Session[] = [];
    for (let i = 0; i < SESSIONS; i++) sessions.push(await signIn(baseUrl, 'tech@demo.test'));
    const customer = await post<{ id: string }>(`${baseUrl}/api/customers`, sessions[0]!, { name: 'Load Test Refrigeration', kind: 'contractor' });
    const technicians: Technician[] = [];
    for (let k = 0; k < opts.technicians; k++) {
      const session = sessions[k % SESSIONS]!;
      const job = await post<{ id: string }>(`${baseUrl}/api/jobs`, session, {
        ...JOB_DEFAULTS,
        customerId: customer.id,
        boardId: DEMO_BOARD_IDS.outdoorFan,
      });
      technicians.push({ cookie: session.cookie, jobId: job.id });
    }
    const target = await readingTarget(baseUrl, sessions[0]!);
    const first = technicians[0]!;
    const dictionaryWait = await waitForDictionary(baseUrl, sessions[0]!, first.jobId, log);
    const rate = (opts.technicians / opts.periodMs) * 1000;
    log(
      `bench:load: ${opts.technicians} technicians, a reading each every ${opts.periodMs / 1000} s + a diagnosis read after each (~${(2 * rate).toFixed(0)} req/s), ${opts.seconds} s, ${opts.servers} server(s)${opts.kill ? ', one SIGKILLed halfway' : ''}`,
    );
    const load = await loadAverage();
    const run = await openLoop({
      baseUrl,
      technicians,
      periodMs: opts.periodMs,
      seconds: opts.seconds,
      body: target.body,
      ...(opts.kill && servers[1] ? { midway: { atMs: (opts.seconds * 1000) / 2, run: () => servers[1]!.kill('SIGKILL') } } : {}),
    });
    const pool = new pg.Pool({ connectionString: db.url, max: 2 });
    let stored = 0;
    try {
      const { rows } = await pool.query<{ n: string }>('SELECT count(*) AS n FROM readings WHERE idempotency_key = ANY($1::text[])', [run.acknowledged]);
      stored = Number(rows[0]!.n);
    } finally {
      await pool.end();
    }
    const ok =
      run.writes.p99 < LOAD_TARGETS.writeP99Ms &&
      run.reads.p99 < LOAD_TARGETS.readP99Ms &&
      run.writes.errors + run.reads.errors === 0 &&
      stored === run.acknowledged.length;
    const { log: _log, ...options } = opts;
    return {
      options,
      writes: run.writes,
      reads: run.reads,
      acknowledged: run.acknowledged.length,
      stored,
      dictionaryWait,
      machine: await machineSize(),
      load,
      ok,
    };
  } finally {
    process.off('SIGINT', onSignal);
    process.off('SIGTERM', onSignal);
    await cleanUp();
  }
}

const ms = (v: number) => `${v.toFixed(1)} ms`;

export function printLoadBench(r: LoadReport, log: (line: string) => void = console.log): void {
  const o = r.options;
  log(`bench:load on ${r.machine}, load average at the start ${r.load}; ${o.servers} server process(es)${o.servers === 2 ? ' behind HAProxy' : ''}`);
  log(`  open loop: ${o.technicians} technicians × 1 reading / ${o.periodMs / 1000} s, diagnosis read after each, ${o.seconds} s`);
  log('  request          req/s     p50       p95       p99       max   requests  errors');
  for (const f of [r.writes, r.reads]) {
    const kinds = Object.entries(f.errorKinds)
      .map(([k, n]) => `${k}×${n}`)
      .join(' ');
    log(
      `  ${f.kind.padEnd(15)} ${f.perSecond.toFixed(0).padStart(6)} ${ms(f.p50).padStart(9)} ${ms(f.p95).padStart(9)} ${ms(f.p99).padStart(9)} ${ms(f.max).padStart(9)} ${String(f.requests).padStart(9)} ${String(f.errors).padStart(7)} ${kinds}`,
    );
  }
  log(`  write latency counts from when the reading was due (open loop); the read's from when it was sent, after the 201`);
  log(`  targets: write p99 < ${LOAD_TARGETS.writeP99Ms} ms, diagnosis read p99 < ${LOAD_TARGETS.readP99Ms} ms, 0 errors`);
  log(`  readings acknowledged with 201: ${r.acknowledged}; of them in the database: ${r.stored} (lost: ${r.acknowledged - r.stored})`);
  log(`  waited ${r.dictionaryWait.toFixed(0)} s for the demo board's fault dictionary before the run`);
  log(r.ok ? 'bench:load: targets met' : 'bench:load: targets MISSED');
}
