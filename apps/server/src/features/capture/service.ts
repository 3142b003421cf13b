// Board capture: a board photographed at intake (not in the library yet), the draft of its model marked on the
// photo, and publishing that draft as a version. The engine side (composing the capture, the expected values) is the
// board library's and the boards feature's; this file stores and checks.
import { and, eq } from 'drizzle-orm';
import { composeCapture } from '@splitscope/boards';
import {
  BOARD_MODEL_SCHEMA_VERSION,
  boardCaptureSchema,
  isPhotoOnlyBoard,
  type BoardCapture,
  type BoardDocument,
  type BoardDraft,
  type CreateUnlistedBoardRequest,
} from '@splitscope/contract';
import type { Actor } from '../../auth/guards';
import type { Db } from '../../db/client';
import { boardDrafts, boardModelVersions, uploads, users } from '../../db/schema';
import { AppError } from '../../http/errors';
import { iso } from '../../lib/dates';
import { newId } from '../../lib/ids';
import { BUS_CAUTION, buildBoardEngine, createBoard, currentBoardVersion, expectedTable, updateBoard } from '../boards';

const slugOf = (text: string) =>
  text
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '')
    .slice(0, 40) || 'board';

async function ownUpload(db: Db, shopId: string, uploadId: string) {
  const [u] = await db
    .select({ id: uploads.id })
    .from(uploads)
    .where(and(eq(uploads.id, uploadId), eq(uploads.shopId, shopId)));
  if (!u) throw new AppError('invalid', `No photo upload ${uploadId}`, { errors: [{ path: 'photo.uploadId', message: 'unknown upload' }] });
}

/** Intake of a board the library does not hold: a board model that is its photo and its maker/model text. */
export async function createUnlistedBoard({ db, actor, input }: { db: Db; actor: Actor; input: CreateUnlistedBoardRequest }) {
  await ownUpload(db, actor.shopId, input.photo.uploadId);
  const name = `${input.maker} ${input.model}`;
  // A short random tail keeps two boards of the same printed name apart until someone merges them.
  const key = `${slugOf(name)}-${newId()
    .slice(-6)
    .toLowerCase()
    .replace(/[^a-z0-9]/g, '0')}`;
  const document: BoardDocument = {
    schemaVersion: BOARD_MODEL_SCHEMA_VERSION,
    id: key,
    slug: key,
    name,
    family: '',
    maker: input.maker,
    description: 'Photographed at intake; no model yet.',
    picture: { uploadId: input.photo.uploadId, width: input.photo.width, height: input.photo.height, units: 'px' },
    sections: [],
    netlist: `* ${name.replace(/\n/g, ' ')}: photographed at intake, no model yet\n.end\n`,
    params: {},
    parts: [],
    nets: [],
    connectors: [],
    testPoints: [],
    faultCodes: [],
    cautions: [BUS_CAUTION],
  };
  return createBoard({ db, actor, document, note: 'Board photographed at intake' });
}

type DraftResult = Omit<BoardDraft, 'boardId' | 'capture' | 'savedAt' | 'savedByName' | 'publishedModel'>;

/** What the engine makes of a capture: the composed model, and each point's expected values or why it has none. */
function evaluate(capture: BoardCapture, document: BoardDocument) {
  const meta = { id: document.id, slug: document.slug, name: document.name, family: document.family, maker: document.maker };
  const composed = composeCapture(capture, meta);
  let problem = composed.problem;
  let rows: ReturnType<typeof expectedTable> = [];
  if (composed.model) {
    try {
      rows = expectedTable(buildBoardEngine('draft', composed.model));
    } catch (err) {
      if (!(err instanceof AppError)) throw err;
      problem = err.message;
    }
  }
  const result: DraftResult = {
    problem,
    nets: composed.nets,
    netlist: composed.model?.netlist ?? null,
    points: capture.points.map((p) => {
      const own = rows.filter((r) => r.red === p.id && r.lifted.length === 0);
      const why = composed.unmodelled[p.id] ?? (problem ? 'the draft does not compute yet' : undefined);
      return {
        id: p.id,
        expected: problem
          ? []
          : own.map((r) => ({
              mode: r.mode,
              power: r.power,
              expected: r.expected,
              low: r.low,
              high: r.high,
              unit: r.unit,
              ...(r.source ? { source: r.source } : {}),
            })),
        ...(why ? { unmodelled: why } : {}),
      };
    }),
  };
  return { model: problem ? null : composed.model, result };
}

/** The board's draft; before anything is saved, a capture of its photo with nothing marked. */
export async function getDraft({ db, shopId, boardId }: { db: Db; shopId: string; boardId: string }): Promise<BoardDraft> {
  const { document } = await currentBoardVersion(db, shopId, boardId);
  const [row] = await db
    .select({ d: boardDrafts, name: users.name })
    .from(boardDrafts)
    .leftJoin(users, eq(users.id, boardDrafts.savedBy))
    .where(eq(boardDrafts.boardId, boardId));
  const publishedModel = !isPhotoOnlyBoard(document);
  if (row) {
    const capture = boardCaptureSchema.parse(row.d.capture);
    return { boardId, capture, savedAt: iso(row.d.savedAt), savedByName: row.name, publishedModel, ...(row.d.result as DraftResult) };
  }
  const uploadId = document.picture.uploadId;
  if (!uploadId) throw new AppError('conflict', `${document.name} has no photo to mark: its picture is drawn from its sections. Edit it in the board editor.`);
  const capture: BoardCapture = {
    photo: { uploadId, width: document.picture.width, height: document.picture.height },
    points: [],
    connectors: [],
    sections: [],
  };
  return { boardId, capture, savedAt: iso(new Date()), savedByName: null, publishedModel, ...evaluate(capture, document).result };
}

/** Saving a draft has the engine compute every point on a modelled net; nothing is published. */
export async function saveDraft({ db, actor, boardId, capture }: { db: Db; actor: Actor; boardId: string; capture: BoardCapture }): Promise<BoardDraft> {
  const { document } = await currentBoardVersion(db, actor.shopId, boardId);
  await ownUpload(db, actor.shopId, capture.photo.uploadId);
  const ids = new Set<string>();
  for (const p of capture.points) {
    if (ids.has(p.id)) throw new AppError('invalid', `Test point ${p.id} is placed twice`, { errors: [{ path: 'capture.points', message: `${p.id} twice` }] });
    ids.add(p.id);
  }
  const { result } = evaluate(capture, document);
  const values = { boardId, capture, result, savedBy: actor.id, savedAt: new Date() };
  await db
    .insert(boardDrafts)
    .values(values)
    .onConflictDoUpdate({ target: boardDrafts.boardId, set: { capture, result, savedBy: actor.id, savedAt: values.savedAt } });
  return getDraft({ db, shopId: actor.shopId, boardId });
}

/** Publishing the saved draft makes the board's next version; jobs already open keep the version they pinned. */
export async function publishDraft({ db, actor, boardId, note }: { db: Db; actor: Actor; boardId: string; note?: string | null }) {
  const { document } = await currentBoardVersion(db, actor.shopId, boardId);
  const [row] = await db.select().from(boardDrafts).where(eq(boardDrafts.boardId, boardId));
  if (!row) throw new AppError('conflict', 'Save a draft before publishing it');
  const { model, result } = evaluate(boardCaptureSchema.parse(row.capture), document);
  if (!model)
    throw new AppError(
      'conflict',
      result.problem ? `The draft does not compute: ${result.problem}` : 'Mark at least one section on the photo before publishing a model',
    );
  return updateBoard({ db, actor, id: boardId, document: model, note: note ?? 'Published from the board capture' });
}

/** Point ids of the saved draft of a version's board: what readings on a photo-only board are recorded against. */
export async function capturedPointIds(db: Db, versionId: string): Promise<Set<string>> {
  const [row] = await db
    .select({ capture: boardDrafts.capture })
    .from(boardModelVersions)
    .innerJoin(boardDrafts, eq(boardDrafts.boardId, boardModelVersions.boardId))
    .where(eq(boardModelVersions.id, versionId));
  const parsed = row ? boardCaptureSchema.safeParse(row.capture) : null;
  return new Set(parsed?.success ? parsed.data.points.map((p) => p.id) : []);
}
