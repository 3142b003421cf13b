// Older stored board documents read as the current form, in memory and without I/O: the start-up step
// (upgrade.ts) stores the rewrite; the engine reader (engine.ts, also loaded in diagnosis threads) reads any
// document still in the older form through the same function, so stored data never makes a job unreadable.
import { BOARD_MODEL_SCHEMA_VERSION } from '@splitscope/contract';

type Json = Record<string, unknown>;
const isRecord = (x: unknown): x is Json => typeof x === 'object' && x !== null && !Array.isArray(x);
const DATA_URL = /^data:image\/(?:png|jpeg);base64,(.+)$/s;
const UPLOAD_URL = /^\/api\/uploads\/([A-Za-z0-9_-]{1,64})$/;

/**
 * The version 2 form of a version 1 document, in memory: what a reader sees before the start-up step has stored
 * the rewrite. An inline photo is answered beside the document (`photo`) so the caller decides whether to store it;
 * a reader that cannot store it shows the board without its picture.
 */
export function upgradeV1InMemory(doc: Json): { document: Json; photo: Buffer | null } {
  const out: Json = { ...doc, schemaVersion: BOARD_MODEL_SCHEMA_VERSION };
  const pic = isRecord(doc.picture) ? doc.picture : {};
  const picture: Json = { width: pic.width, height: pic.height, units: pic.units };
  const url = typeof pic.url === 'string' ? pic.url : '';
  const inline = DATA_URL.exec(url);
  const linked = UPLOAD_URL.exec(url);
  if (linked) picture.uploadId = linked[1];
  // An inline SVG was the drawing of the composition (drawn again on request) or a pasted drawing, which the
  // schema no longer carries: a board without a photo shows its drawing or no picture.
  out.picture = picture;
  const priors = isRecord(doc.priors) ? doc.priors : {};
  delete out.priors;
  if (Array.isArray(doc.parts)) {
    out.parts = doc.parts.map((p: unknown) => {
      if (!isRecord(p) || typeof p.designator !== 'string' || !isRecord(priors[p.designator])) return p;
      return { ...p, priors: priors[p.designator] };
    });
  }
  return { document: out, photo: inline ? Buffer.from(inline[1]!, 'base64') : null };
}

/** A stored document below the current schema version (version 1 has no `schemaVersion`). */
export const isOlderDocument = (doc: unknown): boolean =>
  isRecord(doc) && (typeof doc.schemaVersion !== 'number' || doc.schemaVersion < BOARD_MODEL_SCHEMA_VERSION);
