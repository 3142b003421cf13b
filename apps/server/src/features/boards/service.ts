import { and, asc, desc, eq, isNull, or } from 'drizzle-orm';
import type {
  BoardDetail,
  BoardDocument,
  BoardSummary,
  CreateFaultCodeRequest,
  ExpectedReadingRow,
  FaultCode,
  UpdateFaultCodeRequest,
} from '@splitscope/contract';
import { ComposeError, drawBoard, type BoardSpec } from '@splitscope/boards';
import type { Actor } from '../../auth/guards';
import type { Db } from '../../db/client';
import { boardModels, boardModelVersions, faultCodes, uploads, users } from '../../db/schema';
import { AppError } from '../../http/errors';
import { iso } from '../../lib/dates';
import { newId } from '../../lib/ids';
import { priorsChanged } from '../../lib/priors-generation';
import { buildBoardEngine, expectedTable, readBoardModel, readStoredBoardModel } from './engine';

type BoardRow = typeof boardModels.$inferSelect;
type VersionRow = typeof boardModelVersions.$inferSelect;

const summary = (b: BoardRow, v: Pick<VersionRow, 'id' | 'version'>): BoardSummary => ({
  id: b.id,
  key: b.key,
  name: b.name,
  version: v.version,
  versionId: v.id,
  updatedAt: iso(b.updatedAt),
});

const faultCode = (f: typeof faultCodes.$inferSelect): FaultCode => ({
  id: f.id,
  boardId: f.boardId,
  code: f.code,
  title: f.title,
  description: f.description,
  sections: f.sections,
  weights: f.weights,
});

/** Checks a model and computes what a stored version keeps beside it. A picture upload must be the shop's own. */
export async function prepareVersion(
  db: Pick<Db, 'select'>,
  shopId: string,
  document: BoardDocument,
): Promise<{ key: string; name: string; expectedReadings: ExpectedReadingRow[] }> {
  const uploadId = document.picture.uploadId;
  if (uploadId) {
    const [u] = await db
      .select({ id: uploads.id })
      .from(uploads)
      .where(and(eq(uploads.id, uploadId), eq(uploads.shopId, shopId)));
    if (!u) throw new AppError('invalid', `No picture upload ${uploadId}`, { errors: [{ path: 'document.picture.uploadId', message: 'unknown upload' }] });
  }
  const engine = buildBoardEngine('unsaved', document);
  return { key: document.id, name: document.name.trim(), expectedReadings: expectedTable(engine) };
}

const documentFaultCodes = (document: BoardDocument): CreateFaultCodeRequest[] =>
  document.faultCodes.map((f) => ({ code: f.code, title: f.meaning || f.code, description: null, sections: f.suspectSections, weights: f.weights ?? {} }));

export async function findBoards({ db, shopId }: { db: Db; shopId: string }) {
  const rows = await db
    .select({ b: boardModels, v: { id: boardModelVersions.id, version: boardModelVersions.version } })
    .from(boardModels)
    .innerJoin(boardModelVersions, and(eq(boardModelVersions.boardId, boardModels.id), eq(boardModelVersions.version, boardModels.currentVersion)))
    .where(eq(boardModels.shopId, shopId))
    .orderBy(asc(boardModels.name));
  return { items: rows.map((r) => summary(r.b, r.v)) };
}

async function boardFaultCodes(db: Db, shopId: string, boardId: string) {
  const rows = await db
    .select()
    .from(faultCodes)
    .where(and(eq(faultCodes.shopId, shopId), or(eq(faultCodes.boardId, boardId), isNull(faultCodes.boardId))))
    .orderBy(asc(faultCodes.code));
  return rows.map(faultCode);
}

/** One board at its newest version, or at `version`; another shop's board is unknown here. */
export async function getBoard({ db, shopId, id, version }: { db: Db; shopId: string; id: string; version?: number }): Promise<BoardDetail> {
  const [b] = await db
    .select()
    .from(boardModels)
    .where(and(eq(boardModels.id, id), eq(boardModels.shopId, shopId)));
  if (!b) throw new AppError('not_found', `No board model ${id}`);
  const [v] = await db
    .select()
    .from(boardModelVersions)
    .where(and(eq(boardModelVersions.boardId, id), eq(boardModelVersions.version, version ?? b.currentVersion)));
  if (!v) throw new AppError('not_found', `Board model ${b.name} has no version ${version}`);
  return boardDetail(db, b, v);
}

/** A board's newest version and its document, read by the one reader; another shop's board is unknown here. */
export async function currentBoardVersion(db: Pick<Db, 'select'>, shopId: string, boardId: string) {
  const [row] = await db
    .select({ b: boardModels, v: boardModelVersions })
    .from(boardModels)
    .innerJoin(boardModelVersions, and(eq(boardModelVersions.boardId, boardModels.id), eq(boardModelVersions.version, boardModels.currentVersion)))
    .where(and(eq(boardModels.id, boardId), eq(boardModels.shopId, shopId)));
  if (!row) throw new AppError('not_found', `No board model ${boardId}`);
  return { board: row.b, version: row.v, document: readBoardModel(row.v.document) };
}

/** A pinned version by its id (for job detail). */
export async function getBoardVersion({ db, shopId, versionId }: { db: Db; shopId: string; versionId: string }): Promise<BoardDetail> {
  const [row] = await db
    .select({ b: boardModels, v: boardModelVersions })
    .from(boardModelVersions)
    .innerJoin(boardModels, eq(boardModels.id, boardModelVersions.boardId))
    .where(and(eq(boardModelVersions.id, versionId), eq(boardModels.shopId, shopId)));
  if (!row) throw new AppError('not_found', `No board model version ${versionId}`);
  return boardDetail(db, row.b, row.v);
}

/** The photo upload, else the server's drawing of the composition, else nothing. */
const pictureUrlOf = (versionId: string, doc: BoardDocument) =>
  doc.picture.uploadId ? `/api/uploads/${doc.picture.uploadId}` : doc.composition ? `/api/boards/versions/${versionId}/picture` : null;

/** The drawing of a version's composition (SVG); 404 when the version has a photo or no composition. */
export async function getBoardDrawing({ db, shopId, versionId }: { db: Db; shopId: string; versionId: string }): Promise<string> {
  const [row] = await db
    .select({ document: boardModelVersions.document })
    .from(boardModelVersions)
    .innerJoin(boardModels, eq(boardModels.id, boardModelVersions.boardId))
    .where(and(eq(boardModelVersions.id, versionId), eq(boardModels.shopId, shopId)));
  if (!row) throw new AppError('not_found', `No board model version ${versionId}`);
  const doc = readBoardModel(row.document);
  if (!doc.composition) throw new AppError('not_found', 'This board model version has no drawing');
  try {
    return drawBoard(doc.composition as unknown as BoardSpec);
  } catch (err) {
    if (err instanceof ComposeError) throw new AppError('not_found', `This version's composition cannot be drawn: ${err.message}`);
    throw err;
  }
}

async function boardDetail(db: Db, b: BoardRow, v: VersionRow): Promise<BoardDetail> {
  const { model: document, problem } = readStoredBoardModel(v.document, { key: b.key, name: b.name });
  return {
    ...summary(b, v),
    document,
    pictureUrl: pictureUrlOf(v.id, document),
    expectedReadings: problem ? [] : (v.expectedReadings as ExpectedReadingRow[]),
    faultCodes: await boardFaultCodes(db, b.shopId, b.id),
    modelProblem: problem ? { message: problem, stored: v.document } : null,
  };
}

/**
 * A lead's corrected form of a stored version the schema rejects, stored in place of it, as the start-up upgrade
 * stores the forms it can make itself. Only an unreadable version is rewritten: nothing was ever judged against
 * it, so jobs pinned to it keep their version and their readings, and are judged from now on. A version that
 * reads never changes (edit the board to make a new one).
 */
export async function correctBoardVersion({ db, actor, versionId, document }: { db: Db; actor: Actor; versionId: string; document: BoardDocument }) {
  const { boardId, version } = await db.transaction(async (tx) => {
    const [row] = await tx
      .select({ b: boardModels, v: boardModelVersions })
      .from(boardModelVersions)
      .innerJoin(boardModels, eq(boardModels.id, boardModelVersions.boardId))
      .where(and(eq(boardModelVersions.id, versionId), eq(boardModels.shopId, actor.shopId)))
      .for('update');
    if (!row) throw new AppError('not_found', `No board model version ${versionId}`);
    if (!readStoredBoardModel(row.v.document, row.b).problem) {
      throw new AppError('conflict', `Version ${row.v.version} of ${row.b.name} reads as it is and never changes; edit the board to make a new version`);
    }
    const prepared = await prepareVersion(tx, actor.shopId, document);
    if (prepared.key !== row.b.key) {
      throw new AppError('invalid', `The document's id "${prepared.key}" is not this board model's ("${row.b.key}")`, {
        errors: [{ path: 'document.id', message: `must be ${row.b.key}` }],
      });
    }
    await tx.update(boardModelVersions).set({ document, expectedReadings: prepared.expectedReadings }).where(eq(boardModelVersions.id, versionId));
    return { boardId: row.b.id, version: row.v.version };
  });
  return getBoard({ db, shopId: actor.shopId, id: boardId, version });
}

export async function createBoard({
  db,
  actor,
  document,
  note,
  id,
  expectedReadings,
}: {
  db: Db;
  actor: Pick<Actor, 'id' | 'shopId'>;
  document: BoardDocument;
  note?: string | null;
  id?: string;
  /** The table another stored version of this same document already holds (a test shop's copy of a demo board). */
  expectedReadings?: ExpectedReadingRow[];
}) {
  const prepared = expectedReadings ? { key: document.id, name: document.name.trim(), expectedReadings } : await prepareVersion(db, actor.shopId, document);
  const boardId = id ?? newId();
  await db.transaction(async (tx) => {
    const [clash] = await tx
      .select({ id: boardModels.id })
      .from(boardModels)
      .where(and(eq(boardModels.shopId, actor.shopId), eq(boardModels.key, prepared.key)));
    if (clash) throw new AppError('conflict', `The library already has a board model "${prepared.key}"; edit it to make a new version`);
    await tx.insert(boardModels).values({ id: boardId, shopId: actor.shopId, key: prepared.key, name: prepared.name, currentVersion: 1 });
    await tx
      .insert(boardModelVersions)
      .values({ id: newId(), boardId, version: 1, document, expectedReadings: prepared.expectedReadings, note: note ?? null, createdBy: actor.id });
    const codes = documentFaultCodes(document);
    if (codes.length) {
      await tx.insert(faultCodes).values(
        codes.map((c) => ({
          id: newId(),
          shopId: actor.shopId,
          boardId,
          code: c.code,
          title: c.title,
          description: c.description ?? null,
          sections: c.sections ?? [],
          weights: c.weights ?? {},
        })),
      );
    }
  });
  return getBoard({ db, shopId: actor.shopId, id: boardId });
}

/** Editing stores a new version; jobs pinned to older versions keep theirs. */
export async function updateBoard({ db, actor, id, document, note }: { db: Db; actor: Actor; id: string; document: BoardDocument; note?: string | null }) {
  const version = await db.transaction(async (tx) => {
    const [b] = await tx
      .select()
      .from(boardModels)
      .where(and(eq(boardModels.id, id), eq(boardModels.shopId, actor.shopId)))
      .for('update');
    if (!b) throw new AppError('not_found', `No board model ${id}`);
    const prepared = await prepareVersion(tx, actor.shopId, document);
    if (prepared.key !== b.key) {
      throw new AppError('invalid', `The document's id "${prepared.key}" is not this board model's ("${b.key}")`, {
        errors: [{ path: 'document.id', message: `must be ${b.key}` }],
      });
    }
    const next = b.currentVersion + 1;
    await tx
      .insert(boardModelVersions)
      .values({ id: newId(), boardId: id, version: next, document, expectedReadings: prepared.expectedReadings, note: note ?? null, createdBy: actor.id });
    await tx.update(boardModels).set({ currentVersion: next, name: prepared.name, updatedAt: new Date() }).where(eq(boardModels.id, id));
    return next;
  });
  return getBoard({ db, shopId: actor.shopId, id, version });
}

export async function findBoardVersions({ db, shopId, id }: { db: Db; shopId: string; id: string }) {
  const [b] = await db
    .select({ id: boardModels.id })
    .from(boardModels)
    .where(and(eq(boardModels.id, id), eq(boardModels.shopId, shopId)));
  if (!b) throw new AppError('not_found', `No board model ${id}`);
  const rows = await db
    .select({ v: boardModelVersions, name: users.name })
    .from(boardModelVersions)
    .leftJoin(users, eq(users.id, boardModelVersions.createdBy))
    .where(eq(boardModelVersions.boardId, id))
    .orderBy(desc(boardModelVersions.version));
  return {
    items: rows.map(({ v, name }) => ({
      versionId: v.id,
      version: v.version,
      note: v.note,
      createdBy: v.createdBy,
      createdByName: name,
      createdAt: iso(v.createdAt),
    })),
  };
}

export async function findFaultCodes({ db, shopId, boardId }: { db: Db; shopId: string; boardId?: string }) {
  if (boardId) {
    const [b] = await db
      .select({ id: boardModels.id })
      .from(boardModels)
      .where(and(eq(boardModels.id, boardId), eq(boardModels.shopId, shopId)));
    if (!b) throw new AppError('not_found', `No board model ${boardId}`);
    return { items: await boardFaultCodes(db, shopId, boardId) };
  }
  const rows = await db.select().from(faultCodes).where(eq(faultCodes.shopId, shopId)).orderBy(asc(faultCodes.code));
  return { items: rows.map(faultCode) };
}

export async function createFaultCode({ db, shopId, input }: { db: Db; shopId: string; input: CreateFaultCodeRequest }) {
  if (input.boardId) {
    const [b] = await db
      .select({ id: boardModels.id })
      .from(boardModels)
      .where(and(eq(boardModels.id, input.boardId), eq(boardModels.shopId, shopId)));
    if (!b) throw new AppError('not_found', `No board model ${input.boardId}`);
  }
  const [row] = await db
    .insert(faultCodes)
    .values({
      id: newId(),
      shopId,
      boardId: input.boardId ?? null,
      code: input.code,
      title: input.title,
      description: input.description ?? null,
      sections: input.sections ?? [],
      weights: onlySuspects(input),
    })
    .returning();
  priorsChanged();
  return faultCode(row!);
}

/** Weights are kept for the code's suspect sections only. */
const onlySuspects = (input: Pick<CreateFaultCodeRequest, 'sections' | 'weights'>) =>
  Object.fromEntries(Object.entries(input.weights ?? {}).filter(([s]) => (input.sections ?? []).includes(s)));

export async function updateFaultCode({ db, shopId, id, input }: { db: Db; shopId: string; id: string; input: UpdateFaultCodeRequest }) {
  const [row] = await db
    .update(faultCodes)
    .set({ code: input.code, title: input.title, description: input.description ?? null, sections: input.sections ?? [], weights: onlySuspects(input) })
    .where(and(eq(faultCodes.id, id), eq(faultCodes.shopId, shopId)))
    .returning();
  if (!row) throw new AppError('not_found', `No fault code ${id}`);
  priorsChanged();
  return faultCode(row);
}

export async function deleteFaultCode({ db, shopId, id }: { db: Db; shopId: string; id: string }) {
  const [row] = await db
    .delete(faultCodes)
    .where(and(eq(faultCodes.id, id), eq(faultCodes.shopId, shopId)))
    .returning({ id: faultCodes.id });
  if (!row) throw new AppError('not_found', `No fault code ${id}`);
  priorsChanged();
}
