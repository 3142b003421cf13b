// Load on the API: reading writes and diagnosis reads at 50 connections, and beside them in the same run a raw
// `pg` insert loop of the same rows into the same table with a pool of 50, as the floor the write path is held
// against. The database is a cluster of this run's own with the shop cluster's durable settings (fsync and
// synchronous commit on), so a write costs what it costs in a shop.
import autocannon, { type Result } from 'autocannon';
import { spawn } from 'node:child_process';
import { randomUUID } from 'node:crypto';
import { join } from 'node:path';
import pg from 'pg';
import { removeCluster } from '../lib/pg';
import { findFreePort } from '../lib/proc';
import { root } from '../lib/stack';
import { machineSize, percentile, proofClusterSpec, proofDatabase, ServerChild, signIn, sleep } from './env';
import { readingsPath, readingTarget } from './target';

export interface BenchOptions {
  connections: number;
  seconds: number;
  log: (line: string) => void;
}

export interface LoadFigures {
  name: string;
  requests: number;
  perSecond: number;
  p50: number;
  p95: number;
  p99: number;
  failed: number;
}

export interface ApiBenchReport {
  writes: LoadFigures;
  diagnosis: LoadFigures;
  rawInserts: LoadFigures;
  /** The same POSTs against Express, helmet and the JSON parser alone: the stack's own floor on this machine. */
  httpFloor: LoadFigures;
  ratio: number;
  ok: boolean;
  machine: string;
}

/** Targets from the issue: a reading write answers within 20 ms at p95, at half the raw insert rate or better. */
export const TARGETS = { writeP95Ms: 20, ratio: 0.5 };

function figures(name: string, times: number[], seconds: number, failed: number): LoadFigures {
  const sorted = [...times].sort((a, b) => a - b);
  return {
    name,
    requests: times.length,
    perSecond: times.length / seconds,
    p50: percentile(sorted, 50),
    p95: percentile(sorted, 95),
    p99: percentile(sorted, 99),
    failed,
  };
}

/** One autocannon run; latencies come from its per-response event, since its summary has no p95. */
async function load(name: string, opts: Parameters<typeof autocannon>[0]): Promise<LoadFigures> {
  const times: number[] = [];
  const run = autocannon(opts);
  run.on('response', (_c, status, _b, ms) => {
    if (status >= 200 && status < 300) times.push(ms);
  });
  const r: Result = await run;
  return figures(name, times, r.duration, r.non2xx + r.errors + r.timeouts);
}

/** The same row the server stored, inserted again with fresh ids by `connections` clients for `seconds`. */
async function rawInsertLoop(url: string, jobId: string, connections: number, seconds: number): Promise<LoadFigures> {
  const pool = new pg.Pool({ connectionString: url, max: connections });
  try {
    const { rows } = await pool.query<Record<string, unknown>>('SELECT * FROM readings WHERE job_id = $1 LIMIT 1', [jobId]);
    const template = rows[0];
    if (!template) throw new Error('no stored reading to copy for the raw insert loop');
    const columns = Object.keys(template);
    const text = `INSERT INTO readings (${columns.map((c) => `"${c}"`).join(', ')}) VALUES (${columns.map((_, i) => `$${i + 1}`).join(', ')})`;
    const times: number[] = [];
    let failed = 0;
    const end = Date.now() + seconds * 1000;
    const t0 = performance.now();
    await Promise.all(
      Array.from({ length: connections }, async () => {
        while (Date.now() < end) {
          const values = columns.map((c) =>
            c === 'id' || c === 'idempotency_key' ? randomUUID() : c === 'created_at' || c === 'taken_at' ? new Date() : template[c],
          );
          const s = performance.now();
          try {
            await pool.query(text, values);
            times.push(performance.now() - s);
          } catch {
            failed++;
          }
        }
      }),
    );
    return figures('raw pg INSERT (pool of 50)', times, (performance.now() - t0) / 1000, failed);
  } finally {
    await pool.end();
  }
}

/** The write run's requests against `apps/server/bench/http-floor.ts`, a child of its own like the real server. */
async function httpFloor(connections: number, seconds: number, request: object): Promise<LoadFigures> {
  const port = await findFreePort(6400 + (process.pid % 400));
  const child = spawn(process.execPath, ['--import', 'tsx', join(root, 'apps', 'server', 'bench', 'http-floor.ts')], {
    cwd: root,
    env: { ...process.env, PORT: String(port) },
    stdio: ['ignore', 'pipe', 'inherit'],
  });
  try {
    await new Promise<void>((resolve, reject) => {
      child.stdout!.on('data', (d: Buffer) => d.toString().includes('listening') && resolve());
      child.once('exit', (code) => reject(new Error(`the HTTP floor server exited (${code})`)));
    });
    const url = `http://127.0.0.1:${port}`;
    await load('warm-up', { url, connections, duration: 2, requests: [request] });
    return await load('HTTP floor (Express alone)', { url, connections, duration: seconds, requests: [request] });
  } finally {
    child.kill('SIGTERM');
  }
}

export async function runApiBench(opts: BenchOptions): Promise<ApiBenchReport> {
  const { log, connections, seconds } = opts;
  const spec = proofClusterSpec('pg-bench');
  let server: ServerChild | null = null;
  const cleanUp = async () => {
    await server?.kill('SIGKILL');
    removeCluster(spec);
  };
  const onSignal = () => void cleanUp().finally(() => process.exit(130));
  process.once('SIGINT', onSignal);
  process.once('SIGTERM', onSignal);
  try {
    const db = await proofDatabase(spec, 'splitscope_bench');
    server = await ServerChild.create(db.url, 'bench-api-server.log', { LOCAL_FAKES: '0' });
    await server.start();
    const session = await signIn(server.url, 'tech@demo.test');
    const target = await readingTarget(server.url, session);
    const headers = { cookie: session.cookie, 'content-type': 'application/json' };
    let i = 0;
    const writeRequest = {
      method: 'POST',
      path: readingsPath(target.jobId),
      headers,
      // A fresh idempotency key per request, so every write stores a row (a repeated key would be a cheap replay).
      setupRequest: (req: { body?: string }) => ({ ...req, body: JSON.stringify(target.body(i++, randomUUID())) }),
    };
    log(`bench:api: server ${server.url}, ${connections} connections, ${seconds} s per run, job ${target.jobId}`);
    await load('warm-up', { url: server.url, connections, duration: 2, requests: [writeRequest] });
    const writes = await load('POST reading', { url: server.url, connections, duration: seconds, requests: [writeRequest] });
    // The diagnosis is read on a job with a bench-sized history, not on the one the write run just filled.
    const readTarget = await readingTarget(server.url, session, target.jobId);
    const readJob = readTarget.jobId;
    for (let k = 0; k < 8; k++) {
      const r = await fetch(server.url + readingsPath(readJob), { method: 'POST', headers, body: JSON.stringify(readTarget.body(k, randomUUID())) });
      if (!r.ok) throw new Error(`a reading for the diagnosis run answered ${r.status}: ${await r.text()}`);
    }
    const diagnosis = await load('GET diagnosis', {
      url: server.url,
      connections,
      duration: seconds,
      requests: [{ method: 'GET', path: `/api/jobs/${encodeURIComponent(readJob)}/diagnosis`, headers }],
    });
    await server.kill('SIGTERM');
    await sleep(200);
    const rawInserts = await rawInsertLoop(db.url, target.jobId, connections, seconds);
    const floor = await httpFloor(connections, seconds, writeRequest);
    const ratio = writes.perSecond / rawInserts.perSecond;
    return {
      writes,
      diagnosis,
      rawInserts,
      httpFloor: floor,
      ratio,
      ok: writes.p95 < TARGETS.writeP95Ms && ratio >= TARGETS.ratio && writes.failed === 0 && diagnosis.failed === 0,
      machine: await machineSize(),
    };
  } finally {
    process.off('SIGINT', onSignal);
    process.off('SIGTERM', onSignal);
    await cleanUp();
  }
}

const ms = (v: number) => `${v.toFixed(1)} ms`;

export function printApiBench(r: ApiBenchReport, log: (line: string) => void = console.log): void {
  log(`bench:api on ${r.machine}`);
  log('  run                          req/s     p50       p95       p99    requests  failed');
  for (const f of [r.writes, r.diagnosis, r.rawInserts, r.httpFloor]) {
    log(
      `  ${f.name.padEnd(27)} ${f.perSecond.toFixed(0).padStart(6)} ${ms(f.p50).padStart(9)} ${ms(f.p95).padStart(9)} ${ms(f.p99).padStart(9)} ${String(f.requests).padStart(9)} ${String(f.failed).padStart(7)}`,
    );
  }
  log(`  write throughput / raw inserts: ${r.ratio.toFixed(2)} (target ≥ ${TARGETS.ratio}); write p95 ${ms(r.writes.p95)} (target < ${TARGETS.writeP95Ms} ms)`);
  log(`  write throughput / HTTP floor: ${(r.writes.perSecond / r.httpFloor.perSecond).toFixed(2)}; the floor's own p95 ${ms(r.httpFloor.p95)}`);
  log(r.ok ? 'bench:api: targets met' : 'bench:api: targets MISSED');
}
