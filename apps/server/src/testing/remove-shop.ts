// Removing a test shop with everything it owns. Which rows a shop owns is read from the database's own catalog, not
// from a list kept by hand: a row is the shop's when its table has a `shop_id` of the shop, or when it references
// (foreign key) a row the shop owns. Tables are emptied children first, so every foreign key holds at each step.
// A table added later is covered the day it has a `shop_id` or a foreign key to one that does.
import { sql, type SQL } from 'drizzle-orm';
import type { Db } from '../db/client';

interface Link {
  child: string;
  cols: string[];
  parent: string;
  parentCols: string[];
}

/**
 * References kept without a foreign key on purpose: the dictionary's rows and pairs are bulk rows written by the
 * builder (docs/decisions/0005-fault-dictionary-storage.md), keyed by the board version they belong to.
 */
const UNDECLARED: Link[] = [
  { child: 'fault_dictionary_rows', cols: ['version_id'], parent: 'board_model_versions', parentCols: ['id'] },
  { child: 'fault_dictionary_pairs', cols: ['version_id'], parent: 'board_model_versions', parentCols: ['id'] },
];

interface Catalog {
  tables: string[];
  withShopId: Set<string>;
  links: Link[];
}

async function readCatalog(db: Pick<Db, 'execute'>): Promise<Catalog> {
  const tables = await db.execute<{ name: string; shop: boolean }>(sql`
    select t.table_name as name,
           exists (select 1 from information_schema.columns c
                   where c.table_schema = 'public' and c.table_name = t.table_name and c.column_name = 'shop_id') as shop
    from information_schema.tables t
    where t.table_schema = 'public' and t.table_type = 'BASE TABLE'
    order by t.table_name`);
  const fks = await db.execute<{ child: string; parent: string; cols: string[]; parent_cols: string[] }>(sql`
    select c.conrelid::regclass::text as child, c.confrelid::regclass::text as parent,
           array(select a.attname::text from unnest(c.conkey) with ordinality k(n, i)
                 join pg_attribute a on a.attrelid = c.conrelid and a.attnum = k.n order by k.i) as cols,
           array(select a.attname::text from unnest(c.confkey) with ordinality k(n, i)
                 join pg_attribute a on a.attrelid = c.confrelid and a.attnum = k.n order by k.i) as parent_cols
    from pg_constraint c
    where c.contype = 'f' and c.connamespace = 'public'::regnamespace`);
  const names = tables.rows.map((r) => r.name);
  const declared = fks.rows.map((r) => ({ child: r.child, parent: r.parent, cols: r.cols, parentCols: r.parent_cols }));
  return {
    tables: names,
    withShopId: new Set(tables.rows.filter((r) => r.shop).map((r) => r.name)),
    links: [...declared, ...UNDECLARED.filter((l) => names.includes(l.child))].filter((l) => l.child !== l.parent),
  };
}

const columns = (table: string, cols: string[]) =>
  sql`(${sql.join(
    cols.map((c) => sql`${sql.identifier(table)}.${sql.identifier(c)}`),
    sql`, `,
  )})`;

/** The condition that picks a table's rows owned by the shop, or null when the table holds none of a shop's rows. */
function ownedBy(catalog: Catalog, shopId: string, table: string, path: string[] = []): SQL | null {
  if (table === 'shops') return sql`${sql.identifier('shops')}.${sql.identifier('id')} = ${shopId}`;
  if (catalog.withShopId.has(table)) return sql`${sql.identifier(table)}.${sql.identifier('shop_id')} = ${shopId}`;
  const through: SQL[] = [];
  for (const l of catalog.links) {
    if (l.child !== table || path.includes(l.parent)) continue;
    const parent = ownedBy(catalog, shopId, l.parent, [...path, table]);
    if (parent) through.push(sql`${columns(table, l.cols)} in (select ${columns(l.parent, l.parentCols)} from ${sql.identifier(l.parent)} where ${parent})`);
  }
  return through.length ? sql`(${sql.join(through, sql` or `)})` : null;
}

/** Tables in an order where every table comes before the tables it references (children first). */
function childrenFirst(catalog: Catalog, tables: string[]): string[] {
  const order: string[] = [];
  const state = new Map<string, 'visiting' | 'done'>();
  const visit = (t: string, via: string[]) => {
    if (state.get(t) === 'done') return;
    if (state.get(t) === 'visiting') throw new Error(`foreign keys form a cycle: ${[...via, t].join(' → ')}; remove-shop cannot order it`);
    state.set(t, 'visiting');
    for (const l of catalog.links) if (l.parent === t && tables.includes(l.child)) visit(l.child, [...via, t]);
    state.set(t, 'done');
    order.push(t);
  };
  for (const t of tables) visit(t, []);
  return order;
}

/** How many rows of each table the shop owns (tables that can hold none are left out). */
export async function shopRowCounts(db: Db, shopId: string): Promise<Record<string, number>> {
  const catalog = await readCatalog(db);
  const counts: Record<string, number> = {};
  for (const t of catalog.tables) {
    const where = ownedBy(catalog, shopId, t);
    if (!where) continue;
    const { rows } = await db.execute<{ n: number }>(sql`select count(*)::int as n from ${sql.identifier(t)} where ${where}`);
    counts[t] = rows[0]!.n;
  }
  return counts;
}

/** Deletes the shop and every row it owns, in one transaction; returns how many rows went from each table. */
export async function removeShop(db: Db, shopId: string): Promise<Record<string, number>> {
  const catalog = await readCatalog(db);
  const owning = catalog.tables.filter((t) => ownedBy(catalog, shopId, t));
  const removed: Record<string, number> = {};
  await db.transaction(async (tx) => {
    for (const t of childrenFirst(catalog, owning)) {
      const result = await tx.execute(sql`delete from ${sql.identifier(t)} where ${ownedBy(catalog, shopId, t)!}`);
      if (result.rowCount) removed[t] = result.rowCount;
    }
  });
  return removed;
}
