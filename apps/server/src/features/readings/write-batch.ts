// Group commit for reading writes. Readings posted while the event loop is busy are stored by one statement in
// one transaction: one round trip and one WAL flush for the lot instead of one each. Every caller is answered
// only after that transaction commits, so an acknowledged reading is as durable as one stored alone. Under load
// this is what keeps a write within a few milliseconds; a lone write waits one turn of the event loop.
import { getTableColumns } from 'drizzle-orm';
import type pg from 'pg';
import { moveOnEvent, readingPhases, statusesTakingReadings } from '@splitscope/contract';
import { poolOf, type Db } from '../../db/client';
import { readings } from '../../db/schema';

export type ReadingRow = typeof readings.$inferSelect;
/** A row as the service builds it; the database adds `created_at`. */
export type NewReading = Omit<ReadingRow, 'createdAt'>;

// The columns and their SQL types. A batch goes as one jsonb array of rows (`jsonb_to_recordset` turns it back
// into rows), so the statement text and its plan are the same for a batch of one or of hundreds and pg prepares
// it once; and one JSON.stringify costs the busy event loop less than pg's escaping of one array per column.
const COLUMNS = [
  ['id', 'text'],
  ['shop_id', 'text'],
  ['job_id', 'text'],
  ['idempotency_key', 'text'],
  ['request_hash', 'text'],
  ['mode', 'meter_mode'],
  ['red', 'text'],
  ['black', 'text'],
  ['red_net', 'text'],
  ['black_net', 'text'],
  ['power', 'power_state'],
  ['lifted', 'jsonb'],
  ['alone', 'text'],
  ['value', 'float8'],
  ['over_limit', 'boolean'],
  ['unit', 'text'],
  ['beep', 'boolean'],
  ['raw', 'text'],
  ['instrument', 'text'],
  ['phase', 'reading_phase'],
  ['supersedes', 'text'],
  ['verdict', 'jsonb'],
  ['safety_bus_volts', 'float8'],
  ['author_id', 'text'],
  ['taken_at', 'timestamptz'],
] as const;

const names = COLUMNS.map(([c]) => c).join(', ');
const picked = COLUMNS.map(([c]) => (c === 'lifted' ? 'ARRAY(SELECT jsonb_array_elements_text(lifted))' : c)).join(', ');

// Which statuses take readings of each phase, and the move the first diagnosis reading makes, are the contract's
// policy: the statement is written from it (constants of the contract's enums, no input), not a copy of it.
const pgStatuses = (statuses: readonly string[]) => `'{${statuses.join(',')}}'::job_status[]`;
const OPEN_STATUSES = `CASE v.phase ${readingPhases.map((p) => `WHEN '${p}' THEN ${pgStatuses(statusesTakingReadings(p))}`).join(' ')} END`;
const START = moveOnEvent('diagnosis-reading');

// A row is stored only when its job (of the row's shop) takes readings of its phase at that moment. The job rows
// are locked, so a status change committed meanwhile is seen, not raced. The lock is exclusive because the first
// diagnosis reading moves a received job to diagnosing in the same statement (two share locks each upgraded
// would deadlock), and taken in id order so that two batches naming the same jobs cannot deadlock either.
// A retried idempotency key stores nothing. `clock_timestamp()` keeps rows of one batch in the order they came.
// Only what the database adds comes back: the rest of each stored row is what was sent.
const TEXT = `
WITH v AS (
  SELECT * FROM jsonb_to_recordset($1::jsonb) AS v(${COLUMNS.map(([c, t]) => `${c} ${t}`).join(', ')})
), locked AS (
  SELECT j.id, j.shop_id, j.status FROM jobs j WHERE (j.id, j.shop_id) IN (SELECT job_id, shop_id FROM v) ORDER BY j.id FOR UPDATE
), open AS (
  SELECT v.* FROM v JOIN locked j ON j.id = v.job_id AND j.shop_id = v.shop_id
  WHERE j.status = ANY (${OPEN_STATUSES})
), ins AS (
  INSERT INTO readings (${names}, created_at)
  SELECT ${picked}, clock_timestamp() FROM open
  ON CONFLICT (job_id, idempotency_key) DO NOTHING
  RETURNING id, phase, job_id, created_at
), started AS (
  UPDATE jobs SET status = '${START.to}', updated_at = now() WHERE status = '${START.from}' AND id IN (SELECT job_id FROM ins WHERE phase = 'diagnosis')
)
SELECT id, created_at FROM ins`;

const MAX_BATCH = 256;
// Batches in flight at once; more would only queue on the pool and split the load into smaller batches.
const MAX_IN_FLIGHT = 4;

interface Pending {
  row: NewReading;
  resolve: (r: ReadingRow | null) => void;
  reject: (err: unknown) => void;
}

const columnsOf = getTableColumns(readings);
const keyOf = new Map(Object.entries(columnsOf).map(([key, col]) => [col.name, key]));
// A column added to the table and not to COLUMNS would be stored as its default without a word: refuse to start.
const missing = [...keyOf.keys()].filter((name) => name !== 'created_at' && !COLUMNS.some(([c]) => c === name));
if (missing.length) throw new Error(`readings batch insert lacks the column(s) ${missing.join(', ')}`);

// Each column's name beside the row field it is read from, paired once rather than looked up per row.
const FIELDS = COLUMNS.map(([name]) => [name, keyOf.get(name)!] as const);

/** The batch as the statement's one parameter: an array of rows keyed by column name. */
function parameter(batch: Pending[]): string {
  return JSON.stringify(
    batch.map(({ row }) => {
      const out: Record<string, unknown> = {};
      for (const [name, key] of FIELDS) out[name] = (row as unknown as Record<string, unknown>)[key] ?? null;
      return out;
    }),
  );
}

// A constraint or data error fails the whole statement; each row is then stored alone, so only the row at fault
// gets the error. A lost connection fails every row the same way and is not retried here (the client retries).
const isRowError = (err: unknown) => /^2[23]/.test(String((err as { code?: unknown }).code ?? ''));

/** Statements run and rows sent through them, for the tests and the figures. */
export const batchStats = { statements: 0, rows: 0 };

class Writer {
  private pending: Pending[] = [];
  private inFlight = 0;
  private scheduled = false;
  constructor(private readonly pool: pg.Pool) {}

  insert(row: NewReading): Promise<ReadingRow | null> {
    return new Promise((resolve, reject) => {
      this.pending.push({ row, resolve, reject });
      this.schedule();
    });
  }

  private schedule(): void {
    if (this.scheduled || this.inFlight >= MAX_IN_FLIGHT || this.pending.length === 0) return;
    this.scheduled = true;
    // After the I/O callbacks of this turn: every request parsed in it joins the batch.
    setImmediate(() => {
      this.scheduled = false;
      const batch = this.pending.splice(0, MAX_BATCH);
      this.inFlight++;
      void this.run(batch).finally(() => {
        this.inFlight--;
        this.schedule();
      });
      this.schedule();
    });
  }

  private async run(batch: Pending[]): Promise<void> {
    batchStats.statements++;
    batchStats.rows += batch.length;
    try {
      const { rows } = await this.pool.query<{ id: string; created_at: Date }>({ name: 'readings_batch_insert_json', text: TEXT, values: [parameter(batch)] });
      const createdAt = new Map(rows.map((r) => [r.id, r.created_at]));
      for (const p of batch) {
        const at = createdAt.get(p.row.id);
        p.resolve(at ? { ...p.row, createdAt: at } : null);
      }
    } catch (err) {
      if (batch.length > 1 && isRowError(err)) {
        await Promise.all(batch.map((p) => this.run([p])));
        return;
      }
      for (const p of batch) p.reject(err);
    }
  }
}

const writers = new WeakMap<pg.Pool, Writer>();

/**
 * Stores a reading with the next batch. Null when nothing was stored: the job is not the row's shop's or does
 * not take readings of that phase now, or a reading with the same idempotency key is already stored.
 */
export function insertReading(db: Db, row: NewReading): Promise<ReadingRow | null> {
  const pool = poolOf(db);
  let w = writers.get(pool);
  if (!w) writers.set(pool, (w = new Writer(pool)));
  return w.insert(row);
}
