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

/** The caution every board without a model carries: its bus is not modelled, so nothing says it is safe. */
export const BUS_CAUTION =
  'Mains and the ~300 V DC bus can kill, and the bulk capacitor holds its charge after the board is unplugged. Discharge and measure the bus before any unpowered test; follow local codes and licensed practice.';

/**
 * What can be shown of a stored document the schema rejects even after the upgrade above: the board as its
 * picture and the test points that still read, with no sections or parts, so it reads as a board without a model
 * (readings recorded, not judged) until a lead stores a corrected form. `board` names it when the document cannot.
 */
export function photoOnlyForm(doc: unknown, board: { key: string; name: string }, pointOk: (tp: unknown) => boolean): Json {
  const raw = isRecord(doc) ? (isOlderDocument(doc) ? upgradeV1InMemory(doc).document : doc) : {};
  const pic = isRecord(raw.picture) ? raw.picture : {};
  const size = (x: unknown, d: number) => (typeof x === 'number' && x > 0 && x <= 20_000 ? x : d);
  const slug = /^[a-z0-9][a-z0-9-]{0,63}$/.test(board.key) ? board.key : 'board';
  return {
    schemaVersion: BOARD_MODEL_SCHEMA_VERSION,
    id: board.key.slice(0, 64) || 'board',
    slug,
    name: board.name.slice(0, 200) || 'Board',
    family: '',
    maker: '',
    picture: {
      ...(typeof pic.uploadId === 'string' ? { uploadId: pic.uploadId } : {}),
      width: size(pic.width, 1000),
      height: size(pic.height, 750),
      units: pic.units === 'mm' ? 'mm' : 'px',
    },
    sections: [],
    netlist: '* stored model awaiting a corrected form\n.end\n',
    params: {},
    parts: [],
    nets: [],
    connectors: [],
    testPoints: Array.isArray(raw.testPoints) ? raw.testPoints.filter(pointOk) : [],
    faultCodes: [],
    cautions: [BUS_CAUTION],
  };
}
