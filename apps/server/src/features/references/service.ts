// Known-good references per board model: sets of readings of boards that work (recorded on purpose, or the
// verification readings of a repaired board promoted by a lead), and the expected bands of each point from the
// three sources the contract names (model, measured, published), with the points where they disagree flagged.
import { and, desc, eq, inArray } from 'drizzle-orm';
import {
  boardWords,
  measuredBand,
  referenceReview,
  wordsModelOf,
  type BoardModel,
  type BoardReferences,
  type CreateReferenceSetRequest,
  type ExpectedReadingRow,
  type ReferenceSet,
} from '@splitscope/contract';
import type { Actor } from '../../auth/guards';
import type { Db } from '../../db/client';
import { boardModelVersions, jobs, referenceReadings, referenceSets, users } from '../../db/schema';
import { countingVerificationReadings } from '../../db/verification-readings';
import { AppError } from '../../http/errors';
import { iso } from '../../lib/dates';
import { newId } from '../../lib/ids';
import { priorsChanged } from '../../lib/priors-generation';
import { currentBoardVersion, readBoardModel } from '../boards';

const norm = (n: string) => (n.trim().toLowerCase() === 'gnd' ? '0' : n.trim().toLowerCase());

/** A probe point's net on a version: a test point's net, else a net the model names. */
function netOf(doc: BoardModel, point: string): string | undefined {
  const tp = doc.testPoints.find((t) => t.id.toLowerCase() === point.trim().toLowerCase());
  if (tp) return norm(tp.net);
  const n = norm(point);
  if (n === '0' || doc.nets.some((x) => norm(x.name) === n)) return n;
  return undefined;
}

type Reading = CreateReferenceSetRequest['readings'][number];

async function storeSet(
  db: Db,
  o: {
    actor: Actor;
    boardId: string;
    versionId: string;
    doc: BoardModel;
    jobId: string | null;
    serial: string | null;
    note: string | null;
    readings: Reading[];
  },
) {
  const rows = o.readings.map((r, i) => {
    const red = netOf(o.doc, r.red);
    const black = netOf(o.doc, r.black);
    if (!red || !black) {
      const which = !red ? r.red : r.black;
      throw new AppError('invalid', `Reading ${i + 1}: ${which} is not a test point or net of this board`, {
        errors: [{ path: `readings.${i}`, message: `${which} is not a test point or net of this board` }],
      });
    }
    return {
      id: newId(),
      setId: '',
      mode: r.mode,
      power: r.power,
      red: r.red,
      black: r.black,
      redNet: red,
      blackNet: black,
      value: r.value === 'OL' ? null : r.value,
      overLimit: r.value === 'OL',
    };
  });
  const id = newId();
  await db.transaction(async (tx) => {
    await tx.insert(referenceSets).values({
      id,
      shopId: o.actor.shopId,
      boardId: o.boardId,
      versionId: o.versionId,
      jobId: o.jobId,
      serial: o.serial,
      note: o.note,
      createdBy: o.actor.id,
    });
    await tx.insert(referenceReadings).values(rows.map((r) => ({ ...r, setId: id })));
  });
  priorsChanged();
  return id;
}

export async function createReferenceSet({ db, actor, boardId, input }: { db: Db; actor: Actor; boardId: string; input: CreateReferenceSetRequest }) {
  const { version, document: doc } = await currentBoardVersion(db, actor.shopId, boardId);
  const readingsIn = (input.readings ?? []).map((r) => ({ ...r }));
  await storeSet(db, { actor, boardId, versionId: version.id, doc, jobId: null, serial: input.serial ?? null, note: input.note ?? null, readings: readingsIn });
  return getBoardReferences({ db, shopId: actor.shopId, boardId });
}

/** A verified job's verification readings (the contract's definition) become a reference set of its board model. */
export async function promoteVerification({ db, actor, jobId, note }: { db: Db; actor: Actor; jobId: string; note: string | null }) {
  const [job] = await db
    .select()
    .from(jobs)
    .where(and(eq(jobs.id, jobId), eq(jobs.shopId, actor.shopId)));
  if (!job) throw new AppError('not_found', `No job ${jobId}`);
  if (job.status !== 'verified' && job.status !== 'returned')
    throw new AppError('conflict', 'Only a repaired board signed off as verified is a known-good reference');
  const [dup] = await db.select({ id: referenceSets.id }).from(referenceSets).where(eq(referenceSets.jobId, jobId));
  if (dup) throw new AppError('conflict', `Job #${job.number}'s verification readings are already a reference`);
  const rows = (await countingVerificationReadings(db, jobId)).rows.filter(
    (r) => r.lifted.length === 0 && r.mode !== 'continuity' && (r.overLimit || r.value !== null),
  );
  if (rows.length === 0)
    throw new AppError('conflict', 'This job has no verification reading to keep as a reference (continuity and readings with a part lifted are not kept)');
  const [v] = await db.select().from(boardModelVersions).where(eq(boardModelVersions.id, job.boardVersionId));
  const doc = readBoardModel(v!.document);
  await storeSet(db, {
    actor,
    boardId: job.boardId,
    versionId: job.boardVersionId,
    doc,
    jobId,
    serial: job.serial,
    note,
    readings: rows.map((r) => ({ mode: r.mode, red: r.red, black: r.black, power: r.power, value: r.overLimit ? 'OL' : (r.value as number) })),
  });
  return getBoardReferences({ db, shopId: actor.shopId, boardId: job.boardId });
}

/** One value per board and point: the numeric readings of each set, their median when a point was read twice. */
export async function measuredPoints(db: Pick<Db, 'select'>, shopId: string, boardId: string) {
  const rows = await db
    .select({
      setId: referenceReadings.setId,
      mode: referenceReadings.mode,
      power: referenceReadings.power,
      red: referenceReadings.redNet,
      black: referenceReadings.blackNet,
      value: referenceReadings.value,
    })
    .from(referenceReadings)
    .innerJoin(referenceSets, eq(referenceSets.id, referenceReadings.setId))
    .where(and(eq(referenceSets.shopId, shopId), eq(referenceSets.boardId, boardId), eq(referenceReadings.overLimit, false)));
  const byPoint = new Map<string, { mode: string; power: string; red: string; black: string; perSet: Map<string, number[]> }>();
  for (const r of rows) {
    if (r.value === null) continue;
    const k = `${r.mode} ${r.power} ${r.red} ${r.black}`;
    let p = byPoint.get(k);
    if (!p) byPoint.set(k, (p = { mode: r.mode, power: r.power, red: r.red, black: r.black, perSet: new Map() }));
    p.perSet.set(r.setId, [...(p.perSet.get(r.setId) ?? []), r.value]);
  }
  const mid = (xs: number[]) => [...xs].sort((a, b) => a - b)[xs.length >> 1] as number;
  return [...byPoint.values()].map((p) => ({
    mode: p.mode as 'dcv' | 'ohm' | 'diode',
    power: p.power as 'on' | 'off',
    red: p.red,
    black: p.black,
    values: [...p.perSet.values()].map(mid),
  }));
}

export async function getBoardReferences({ db, shopId, boardId }: { db: Db; shopId: string; boardId: string }): Promise<BoardReferences> {
  const { version, document: doc } = await currentBoardVersion(db, shopId, boardId);
  const setRows = await db
    .select({ s: referenceSets, name: users.name, number: jobs.number, version: boardModelVersions.version })
    .from(referenceSets)
    .innerJoin(users, eq(users.id, referenceSets.createdBy))
    .innerJoin(boardModelVersions, eq(boardModelVersions.id, referenceSets.versionId))
    .leftJoin(jobs, eq(jobs.id, referenceSets.jobId))
    .where(and(eq(referenceSets.shopId, shopId), eq(referenceSets.boardId, boardId)))
    .orderBy(desc(referenceSets.createdAt));
  const counts = setRows.length
    ? await db
        .select({ setId: referenceReadings.setId })
        .from(referenceReadings)
        .where(
          inArray(
            referenceReadings.setId,
            setRows.map((r) => r.s.id),
          ),
        )
    : [];
  const sets: ReferenceSet[] = setRows.map(({ s, name, number, version: v }) => ({
    id: s.id,
    boardId: s.boardId,
    boardVersion: v,
    jobId: s.jobId,
    jobNumber: number ?? null,
    serial: s.serial,
    note: s.note,
    origin: s.jobId ? 'verification' : 'recorded',
    readings: counts.filter((c) => c.setId === s.id).length,
    createdByName: name,
    createdAt: iso(s.createdAt),
  }));

  const measured = await measuredPoints(db, shopId, boardId);
  const words = boardWords(wordsModelOf(doc));
  const bands: BoardReferences['bands'] = [];
  const seen = new Set<string>();
  for (const row of version.expectedReadings as ExpectedReadingRow[]) {
    if (row.lifted.length > 0 || row.mode === 'continuity') continue;
    const red = netOf(doc, row.red);
    const black = netOf(doc, row.black);
    const key = `${row.mode} ${row.power} ${red} ${black}`;
    const m = measured.find((p) => `${p.mode} ${p.power} ${p.red} ${p.black}` === key);
    const tp = doc.testPoints.find((t) => t.id === row.red);
    const published = row.mode === 'dcv' && row.power === 'on' && tp?.band ? tp.band : null;
    if (!m && !published) continue;
    seen.add(key);
    const model = row.low !== null && row.high !== null ? { expected: row.expected, low: row.low, high: row.high } : null;
    const mb = m ? measuredBand(m.mode, m.values) : null;
    bands.push({
      mode: row.mode,
      power: row.power,
      red: row.red,
      black: row.black,
      label: words.probe(row.red),
      unit: row.unit,
      model,
      measured: mb,
      published,
      review: referenceReview(row.unit === 'ohm' ? 'Ω' : 'V', model, mb, published),
    });
  }
  // Points the good boards were read on that the model's table does not hold: measured only.
  for (const p of measured) {
    if (seen.has(`${p.mode} ${p.power} ${p.red} ${p.black}`)) continue;
    bands.push({
      mode: p.mode,
      power: p.power,
      red: p.red,
      black: p.black,
      label: words.probe(p.red),
      unit: p.mode === 'ohm' ? 'ohm' : 'V',
      model: null,
      measured: measuredBand(p.mode, p.values),
      published: null,
      review: null,
    });
  }
  return { sets, bands };
}
