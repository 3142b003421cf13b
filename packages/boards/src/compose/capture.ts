/**
 * A board capture (points, connectors and template sections marked on a photo) → a board-model document. The
 * sections compose as any template board does; each point whose net a section models becomes a test point at the
 * spot it was placed on the photo; a point on no modelled net stays in the capture, recorded but not judged.
 */
import { BOARD_MODEL_SCHEMA_VERSION, boardModelSchema, type BoardCapture, type BoardModel } from '@splitscope/contract';
import { composeBoard, ComposeError } from './compose';
import type { BoardSpec } from './types';

export interface CaptureMeta {
  id: string;
  slug: string;
  name: string;
  family: string;
  maker: string;
}

export interface ComposedCapture {
  /** The model, or null while no section is marked (or the sections do not compose: see `problem`). */
  model: BoardModel | null;
  problem: string | null;
  /** Point id → why it has no expected value. */
  unmodelled: Record<string, string>;
  /** Nets the sections model, for binding points. */
  nets: { name: string; label: string }[];
}

const COLD_GROUND = 'gnd_c';

function specOf(capture: BoardCapture, meta: CaptureMeta, testPoints: BoardSpec['testPoints']): BoardSpec {
  return {
    ...meta,
    width: capture.photo.width,
    height: capture.photo.height,
    coldGround: COLD_GROUND,
    sections: capture.sections.map((s) => ({
      id: s.id,
      template: s.template,
      base: s.base,
      region: s.region,
      nets: s.nets,
      params: s.params,
      values: s.values,
      markings: s.markings,
      ...(s.title ? { title: s.title } : {}),
    })),
    connectors: capture.connectors.map((c) => ({ name: c.name, x: c.x, y: c.y, ...(c.title ? { title: c.title } : {}), pins: c.pins })),
    testPoints,
  };
}

/** Composes a capture. Never throws for a capture the contract accepts: a section that does not compose is a `problem`. */
export function composeCapture(capture: BoardCapture, meta: CaptureMeta): ComposedCapture {
  const noModel = (why: string) => Object.fromEntries(capture.points.map((p) => [p.id, why]));
  if (capture.sections.length === 0) {
    return { model: null, problem: null, unmodelled: noModel('no section is marked on this board yet'), nets: [] };
  }
  let bare: BoardModel;
  try {
    bare = composeBoard(specOf(capture, meta, []));
  } catch (err) {
    if (!(err instanceof ComposeError)) throw err;
    return { model: null, problem: err.message, unmodelled: noModel('the sections do not compose yet'), nets: [] };
  }
  // A net is probed only where a part of the model touches it (the test point is placed beside that part).
  const touched = new Set(bare.parts.flatMap((p) => p.pins.map((pin) => pin.net)));
  const nets = bare.nets.filter((n) => touched.has(n.name) && n.name !== '0' && n.name !== COLD_GROUND).map((n) => ({ name: n.name, label: n.label }));
  const unmodelled: Record<string, string> = {};
  const bound = capture.points.filter((p) => {
    if (!p.net) unmodelled[p.id] = 'no net named for this point';
    else if (!touched.has(p.net)) unmodelled[p.id] = `net "${p.net}" is not on any marked section`;
    return p.net && touched.has(p.net);
  });
  const composed = composeBoard(
    specOf(
      capture,
      meta,
      bound.map((p) => ({ id: p.id, net: p.net!, ...(p.label ? { label: p.label } : {}) })),
    ),
  );
  const at = new Map(bound.map((p) => [p.id, p]));
  const model = boardModelSchema.parse({
    ...composed,
    schemaVersion: BOARD_MODEL_SCHEMA_VERSION,
    picture: { uploadId: capture.photo.uploadId, width: capture.photo.width, height: capture.photo.height, units: 'px' },
    testPoints: composed.testPoints.map((tp) => ({ ...tp, x: at.get(tp.id)!.x, y: at.get(tp.id)!.y })),
  });
  return { model, problem: null, unmodelled, nets };
}
