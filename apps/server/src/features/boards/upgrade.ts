// Start-time upgrade of stored board documents to the current board-model schema (version 2). Version 1 documents
// carried their picture inline (`picture.svg`, or a photo as a data URL in `picture.url`, which broke the schema's
// length limit) and their part priors in a document-level map. Version 2 stores a photo as an upload named by
// `picture.uploadId`, draws a composed board from its composition, and keeps priors on the parts. The rewrite keeps
// the meaning of each version (same netlist, parts, points, expected table), so jobs pinned to it read as before.
import { eq, sql } from 'drizzle-orm';
import { BOARD_MODEL_SCHEMA_VERSION, boardModelSchema } from '@splitscope/contract';
import type { Db } from '../../db/client';
import { boardModels, boardModelVersions } from '../../db/schema';
import type { Storage } from '../../storage/storage';
import { storeUpload } from '../uploads';
import { upgradeV1InMemory } from './document-form';

type Json = Record<string, unknown>;
const isRecord = (x: unknown): x is Json => typeof x === 'object' && x !== null && !Array.isArray(x);

export interface UpgradeOutcome {
  upgraded: number;
  /** Versions left as they were, with the schema's complaint: shown at start so nobody wonders why a board fails. */
  failed: { versionId: string; message: string }[];
}

/**
 * The version 2 form of a version 1 document. `storePhoto` keeps an inline photo as an upload and answers its id.
 * Exported for its test; the start-up step below is what runs it.
 */
export async function upgradeV1(doc: Json, storePhoto: (bytes: Buffer) => Promise<string>): Promise<Json> {
  const { document, photo } = upgradeV1InMemory(doc);
  if (photo) (document.picture as Json).uploadId = await storePhoto(photo);
  return document;
}

/** Upgrades every stored version below the current schema version; idempotent (upgraded rows are not selected again). */
export async function upgradeBoardDocuments({ db, storage }: { db: Db; storage: Storage }): Promise<UpgradeOutcome> {
  const rows = await db
    .select({
      id: boardModelVersions.id,
      document: boardModelVersions.document,
      createdBy: boardModelVersions.createdBy,
      shopId: boardModels.shopId,
      name: boardModels.name,
    })
    .from(boardModelVersions)
    .innerJoin(boardModels, eq(boardModels.id, boardModelVersions.boardId))
    .where(sql`coalesce((${boardModelVersions.document}->>'schemaVersion')::int, 1) < ${BOARD_MODEL_SCHEMA_VERSION}`);
  const outcome: UpgradeOutcome = { upgraded: 0, failed: [] };
  for (const row of rows) {
    const doc = isRecord(row.document) ? row.document : {};
    try {
      const next = await upgradeV1(doc, async (bytes) => {
        if (!row.createdBy) throw new Error('the inline photo has no author to store it under');
        return (await storeUpload({ db, storage, shopId: row.shopId, createdBy: row.createdBy, bytes, name: `${row.name} (photo)` })).id;
      });
      const parsed = boardModelSchema.safeParse(next);
      if (!parsed.success) {
        const issue = parsed.error.issues[0]!;
        outcome.failed.push({ versionId: row.id, message: `${issue.path.join('.')}: ${issue.message}` });
        continue;
      }
      await db.update(boardModelVersions).set({ document: parsed.data }).where(eq(boardModelVersions.id, row.id));
      outcome.upgraded++;
    } catch (err) {
      outcome.failed.push({ versionId: row.id, message: (err as Error).message });
    }
  }
  return outcome;
}
