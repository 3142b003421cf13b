// Which tables a request wrote, told by triggers in the fuzzing database: exact, and one query per request
// instead of a checksum of every table (which made a 10,000-payload run take an hour on two cores).
import type pg from 'pg';

export interface Writes {
  /** Tables with any inserted, updated or deleted row. */
  changed: string[];
  /** Tables with an inserted row. */
  inserted: string[];
}

/** Adds a row trigger to every table of the public schema that notes the table and operation in `fuzz_writes`. */
export async function installWriteLog(client: pg.Client): Promise<void> {
  await client.query('CREATE UNLOGGED TABLE IF NOT EXISTS fuzz_writes (t text NOT NULL, op text NOT NULL)');
  await client.query(`CREATE OR REPLACE FUNCTION fuzz_note() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN INSERT INTO fuzz_writes VALUES (TG_TABLE_NAME, TG_OP); RETURN NULL; END $$`);
  const { rows } = await client.query<{ t: string }>(
    "SELECT table_name AS t FROM information_schema.tables WHERE table_schema = 'public' AND table_type = 'BASE TABLE' AND table_name <> 'fuzz_writes'",
  );
  for (const { t } of rows) {
    const q = `"${t.replace(/"/g, '""')}"`;
    await client.query(`DROP TRIGGER IF EXISTS fuzz_note ON ${q}`);
    await client.query(`CREATE TRIGGER fuzz_note AFTER INSERT OR UPDATE OR DELETE ON ${q} FOR EACH ROW EXECUTE FUNCTION fuzz_note()`);
  }
}

/** The tables written since the last call (and forgets them). */
export async function takeWrites(client: pg.Client): Promise<Writes> {
  const { rows } = await client.query<{ t: string; op: string }>('DELETE FROM fuzz_writes RETURNING t, op');
  return {
    changed: [...new Set(rows.map((r) => r.t))].sort(),
    inserted: [...new Set(rows.filter((r) => r.op === 'INSERT').map((r) => r.t))].sort(),
  };
}

/** The writes of a request whose route answers first and works after: collected until 1 s passes without one (at most 8 s). */
export async function settledWrites(client: pg.Client): Promise<Writes> {
  const changed = new Set<string>();
  const inserted = new Set<string>();
  let quiet = 0;
  for (let waited = 0; quiet < 10 && waited < 8000; waited += 100) {
    await new Promise((r) => setTimeout(r, 100));
    const w = await takeWrites(client);
    quiet = w.changed.length ? 0 : quiet + 1;
    w.changed.forEach((t) => changed.add(t));
    w.inserted.forEach((t) => inserted.add(t));
  }
  return { changed: [...changed].sort(), inserted: [...inserted].sort() };
}
