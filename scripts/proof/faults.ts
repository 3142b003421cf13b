// Fault injection: technicians post readings (idempotency keys, retries as the web client does) while the server
// is SIGKILLed and restarted and PostgreSQL is restarted with a fast shutdown. Every acknowledged reading must be
// stored exactly once. Bounded: the chaos schedule is fixed, writing stops at a deadline, draining has its own.
import { randomUUID } from 'node:crypto';
import pg from 'pg';
import { ensureCluster, removeCluster, restartCluster, stopCluster, type ClusterSpec } from '../lib/pg';
import { proofClusterSpec, proofDatabase, ServerChild, signIn, sleep, type ProofDatabase, type Session } from './env';
import { readingsPath, readingTarget, type ReadingTarget } from './target';

export interface FaultOptions {
  technicians: number;
  serverKills: number;
  /** At least 2: one `pg_ctl restart -m fast`, the rest a fast stop held down for `dbDownMs`, then a start. */
  dbRestarts: number;
  /** Pause between faults, in ms. */
  gapMs: number;
  dbDownMs: number;
  log: (line: string) => void;
}

export interface FaultReport {
  ok: boolean;
  sent: number;
  acknowledged: number;
  stored: number;
  duplicates: number;
  lost: number;
  /** Rows on the job that no technician sent. */
  unexpected: number;
  refused: number;
  attempts: number;
  serverKills: number;
  dbRestarts: number;
  unavailable503: number;
  unavailableWithoutRetryAfter: number;
  otherServerErrors: number;
  ackedAfterLastDbRestart: number;
  problems: string[];
  seconds: number;
}

export const FULL: Omit<FaultOptions, 'log'> = { technicians: 6, serverKills: 5, dbRestarts: 3, gapMs: 3000, dbDownMs: 3000 };
export const SHORT: Omit<FaultOptions, 'log'> = { technicians: 4, serverKills: 2, dbRestarts: 2, gapMs: 1500, dbDownMs: 2000 };

interface Tally {
  sent: Set<string>;
  acked: Set<string>;
  refused: number;
  attempts: number;
  unavailable503: number;
  noRetryAfter: number;
  otherServerErrors: number;
  lastDbRestartAt: number;
  ackedAfterLastDbRestart: number;
  refusals: string[];
}

/** One reading, sent until the server acknowledges or refuses it (a 4xx other than 429), or the deadline passes. */
async function sendReading(baseUrl: string, session: Session, target: ReadingTarget, i: number, tally: Tally, deadline: number): Promise<void> {
  const key = randomUUID();
  const body = JSON.stringify(target.body(i, key));
  tally.sent.add(key);
  let backoff = 100;
  while (Date.now() < deadline) {
    tally.attempts++;
    let status: number;
    let retryAfter: string | null = null;
    try {
      const r = await fetch(baseUrl + readingsPath(target.jobId), {
        method: 'POST',
        headers: { 'content-type': 'application/json', cookie: session.cookie, 'idempotency-key': key },
        body,
        signal: AbortSignal.timeout(5000),
      });
      status = r.status;
      retryAfter = r.headers.get('retry-after');
      const text = await r.text();
      if (status >= 400 && status < 500 && status !== 429 && tally.refusals.length < 5) tally.refusals.push(`${status} ${text.slice(0, 200)}`);
    } catch {
      status = 0; // connection refused or reset: the server is down or was killed mid-request
    }
    if (status >= 200 && status < 300) {
      tally.acked.add(key);
      if (tally.lastDbRestartAt && Date.now() > tally.lastDbRestartAt) tally.ackedAfterLastDbRestart++;
      return;
    }
    if (status === 503) {
      tally.unavailable503++;
      if (!retryAfter) tally.noRetryAfter++;
    } else if (status >= 500) tally.otherServerErrors++;
    else if (status !== 0 && status !== 429) {
      tally.refused++;
      return;
    }
    const hinted = retryAfter && Number.isFinite(Number(retryAfter)) ? Number(retryAfter) * 1000 : 0;
    await sleep(Math.min(1000, Math.max(backoff, Math.min(hinted, 1000))) * (0.5 + Math.random() / 2));
    backoff = Math.min(1000, backoff * 2);
  }
}

export async function runFaults(opts: FaultOptions): Promise<FaultReport> {
  const t0 = Date.now();
  const spec = proofClusterSpec('pg-faults');
  let server: ServerChild | null = null;
  // The run owns its cluster and server: both go away at the end, on a failure and on Ctrl-C alike.
  const cleanUp = async () => {
    await server?.kill('SIGKILL');
    removeCluster(spec);
  };
  const onSignal = (signal: NodeJS.Signals) => void cleanUp().finally(() => process.exit(signal === 'SIGINT' ? 130 : 143));
  process.once('SIGINT', onSignal);
  process.once('SIGTERM', onSignal);
  try {
    const db = await proofDatabase(spec, 'splitscope_faults');
    server = await ServerChild.create(db.url, 'faults-server.log', { LOCAL_FAKES: '0' });
    return await faultRun(opts, t0, { ...spec, port: db.cluster.port }, db, server);
  } finally {
    process.off('SIGINT', onSignal);
    process.off('SIGTERM', onSignal);
    await cleanUp();
  }
}

async function faultRun(opts: FaultOptions, t0: number, fixedSpec: ClusterSpec, db: ProofDatabase, server: ServerChild): Promise<FaultReport> {
  const { log } = opts;
  const problems: string[] = [];
  let serverKills = 0;
  let dbRestarts = 0;
  const tally: Tally = {
    sent: new Set(),
    acked: new Set(),
    refused: 0,
    attempts: 0,
    unavailable503: 0,
    noRetryAfter: 0,
    otherServerErrors: 0,
    lastDbRestartAt: 0,
    ackedAfterLastDbRestart: 0,
    refusals: [],
  };
  let jobId: string;
  try {
    await server.start();
    const emails = ['tech@demo.test', 'lead@demo.test', 'admin@demo.test'];
    const sessions = await Promise.all(Array.from({ length: opts.technicians }, (_, i) => signIn(server.url, emails[i % emails.length]!)));
    const target = await readingTarget(server.url, sessions[0]!);
    jobId = target.jobId;

    // A probe that a write is refused with 503 + Retry-After while the database is down.
    const probeDown = async (): Promise<void> => {
      const r = await fetch(server.url + readingsPath(target.jobId), {
        method: 'POST',
        headers: { 'content-type': 'application/json', cookie: sessions[0]!.cookie },
        body: JSON.stringify(target.body(0, `probe-${randomUUID()}`)),
        signal: AbortSignal.timeout(8000),
      }).catch(() => null);
      const h = await fetch(`${server.url}/api/health`, { signal: AbortSignal.timeout(8000) }).catch(() => null);
      if (!r || r.status !== 503 || !r.headers.get('retry-after'))
        problems.push(
          `with the database down a reading write answered ${r?.status ?? 'no response'} (retry-after: ${r?.headers.get('retry-after') ?? 'none'}), not 503 with Retry-After`,
        );
      if (!h || h.status !== 503) problems.push(`with the database down /api/health answered ${h?.status ?? 'no response'}, not 503`);
      log(`  database down: reading write ${r?.status ?? '-'} retry-after=${r?.headers.get('retry-after') ?? '-'}, health ${h?.status ?? '-'}`);
    };

    // The fixed chaos schedule: server kills interleaved with database restarts; the last fault is a database
    // restart with no server restart after it, so later acknowledgements show the server reconnected by itself.
    const faults: ('kill' | 'db')[] = [];
    for (let k = 1, d = 0; k <= opts.serverKills; k++) {
      faults.push('kill');
      for (; d < opts.dbRestarts && k >= Math.ceil(((d + 1) * opts.serverKills) / opts.dbRestarts); d++) faults.push('db');
    }
    // Writing goes on until one gap after the last fault (server start-up time varies with the machine's
    // load, so no fixed deadline); a hard cap keeps the run bounded if a start hangs.
    const hardStop = Date.now() + 120_000;
    let writeUntil = hardStop;
    log(`faults: ${opts.technicians} technicians; schedule ${faults.join(', ')}`);

    let next = 0;
    const workers = sessions.map(async (session) => {
      while (Date.now() < writeUntil) {
        await sendReading(server.url, session, target, next++, tally, hardStop + 30_000);
        await sleep(Math.random() * 20);
      }
    });

    const chaos = (async () => {
      let dbIndex = 0;
      for (const fault of faults) {
        await sleep(opts.gapMs);
        if (fault === 'kill') {
          await server.kill('SIGKILL');
          serverKills++;
          await sleep(300 + Math.random() * 500);
          await server.start();
          log(`  server SIGKILLed and restarted (${serverKills})`);
        } else if (dbIndex++ === 0) {
          restartCluster(fixedSpec);
          dbRestarts++;
          tally.lastDbRestartAt = Date.now();
          log(`  PostgreSQL restarted, fast shutdown (${dbRestarts})`);
        } else {
          stopCluster(fixedSpec);
          await sleep(300);
          await probeDown();
          await sleep(opts.dbDownMs);
          await ensureCluster(fixedSpec);
          dbRestarts++;
          tally.lastDbRestartAt = Date.now();
          log(`  PostgreSQL stopped (fast) for ${opts.dbDownMs / 1000} s and started again (${dbRestarts})`);
        }
      }
      writeUntil = Math.min(hardStop, Date.now() + opts.gapMs);
    })();
    await Promise.all([chaos, ...workers]);
  } finally {
    await server.kill('SIGTERM');
  }

  // The database's word, not the server's: rows on the job, grouped by idempotency key.
  const client = new pg.Client({ connectionString: db.url });
  await client.connect();
  let stored = 0;
  let duplicates = 0;
  let unexpected = 0;
  let lost = 0;
  try {
    const { rows } = await client.query<{ key: string; n: string }>(
      'SELECT idempotency_key AS key, count(*) AS n FROM readings WHERE job_id = $1 GROUP BY idempotency_key',
      [jobId],
    );
    const byKey = new Map(rows.map((r) => [r.key, Number(r.n)]));
    for (const [key, n] of byKey) {
      if (tally.sent.has(key)) stored++;
      else if (!key.startsWith('probe-')) unexpected += n;
      duplicates += n - 1;
    }
    for (const key of tally.acked) if (!byKey.has(key)) lost++;
  } finally {
    await client.end();
  }

  if (lost) problems.push(`${lost} acknowledged readings are not in the database`);
  if (duplicates) problems.push(`${duplicates} readings are stored more than once`);
  if (unexpected) problems.push(`${unexpected} rows on the job were never sent`);
  if (tally.acked.size === 0) problems.push('no reading was acknowledged');
  if (serverKills < opts.serverKills) problems.push(`only ${serverKills} of ${opts.serverKills} server kills happened`);
  if (dbRestarts < opts.dbRestarts) problems.push(`only ${dbRestarts} of ${opts.dbRestarts} database restarts happened`);
  if (tally.noRetryAfter) problems.push(`${tally.noRetryAfter} answers 503 came without Retry-After`);
  if (tally.otherServerErrors) problems.push(`${tally.otherServerErrors} answers were a 5xx other than 503`);
  if (tally.ackedAfterLastDbRestart === 0) problems.push('no reading was acknowledged after the last database restart (no reconnect?)');
  if (tally.refused) problems.push(`${tally.refused} readings were refused: ${tally.refusals.join(' | ')}`);

  return {
    ok: problems.length === 0,
    sent: tally.sent.size,
    acknowledged: tally.acked.size,
    stored,
    duplicates,
    lost,
    unexpected,
    refused: tally.refused,
    attempts: tally.attempts,
    serverKills,
    dbRestarts,
    unavailable503: tally.unavailable503,
    unavailableWithoutRetryAfter: tally.noRetryAfter,
    otherServerErrors: tally.otherServerErrors,
    ackedAfterLastDbRestart: tally.ackedAfterLastDbRestart,
    problems,
    seconds: (Date.now() - t0) / 1000,
  };
}

export function printFaultReport(r: FaultReport, log: (line: string) => void = console.log): void {
  log(
    `faults: sent ${r.sent}, acknowledged ${r.acknowledged}, stored ${r.stored}, duplicates ${r.duplicates}, lost ${r.lost}` +
      ` (attempts ${r.attempts}, 503s ${r.unavailable503}, server kills ${r.serverKills}, database restarts ${r.dbRestarts}, ${r.seconds.toFixed(1)} s)`,
  );
  for (const p of r.problems) log(`faults: FAIL ${p}`);
  log(r.ok ? 'faults: ok' : 'faults: FAILED');
}
