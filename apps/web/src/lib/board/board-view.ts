/**
 * What the bench draws, read out of a board-model document (schema in the contract): positions, nets, labels and
 * sections. Connector pins have no positions of their own in the model, so they are laid out in a row here.
 */
import { boardModelSchema, boardWords, wordsModelOf, type BoardModel } from '@splitscope/contract';
import type { MapConnector, MapPart } from '@/components/board-map/board-map';

export interface BoardPoint {
  id: string;
  label: string;
  net: string;
  reference: string;
  x: number;
  y: number;
  section?: string;
  touchesBus: boolean;
}

export interface BoardSection {
  id: string;
  name: string;
  touchesBus: boolean;
}

export interface BoardView {
  model: BoardModel | null;
  problem?: string;
  size: { width: number; height: number };
  pictureUrl?: string;
  points: BoardPoint[];
  parts: (MapPart & { label: string; section?: string })[];
  connectors: MapConnector[];
  sections: BoardSection[];
  cautions: string[];
  /** Names a probe position in words: a test point's label, a net's label, or the net name. */
  netLabel: (netOrPoint: string) => string;
  pointOf: (netOrPoint: string) => BoardPoint | undefined;
}

/** `pictureUrl` is the board detail's: the photo upload or the server's drawing of the composition. */
export function boardView(document: unknown, pictureUrl?: string | null): BoardView {
  const parsed = boardModelSchema.safeParse(document);
  const m = parsed.success ? parsed.data : null;
  const width = m?.picture.width ?? 1000;
  const height = m?.picture.height ?? 700;
  const unit = width / 60; // a part outline and pin pitch sized to the board, not to the screen

  const points: BoardPoint[] = (m?.testPoints ?? []).map((t) => ({
    id: t.id,
    label: t.label ? `${t.id} ${t.label}` : t.id,
    net: t.net,
    reference: t.reference,
    x: t.x,
    y: t.y,
    section: t.section,
    touchesBus: t.touchesBus,
  }));
  const words = boardWords(m);
  const parts = (m?.parts ?? []).map((p) => ({
    id: p.designator,
    x: p.x - unit,
    y: p.y - unit * 0.6,
    width: unit * 2,
    height: unit * 1.2,
    label: `${words.designator(p.designator)} ${p.value}`,
    section: p.section,
  }));
  const connectors: MapConnector[] = (m?.connectors ?? []).map((c) => ({
    id: c.name,
    x: c.x,
    y: c.y,
    pins: c.pins.map((p, i) => ({ label: p.pin, net: p.net, x: c.x + i * unit * 1.4, y: c.y })),
  }));
  const sections: BoardSection[] = (m?.sections ?? []).map((s) => ({ id: s.id, name: s.title || s.id, touchesBus: s.touchesBus }));

  const norm = (s: string) => s.trim().toLowerCase();
  const byId = new Map(points.map((p) => [norm(p.id), p]));
  const byNet = new Map<string, BoardPoint>();
  for (const p of points) if (!byNet.has(norm(p.net))) byNet.set(norm(p.net), p);
  const pointOf = (s: string) => byId.get(norm(s)) ?? byNet.get(norm(s));
  // Probe positions in the bench's words: the contract's one function (test point, connector pin, part pin).
  const netLabel = boardWords(m ?? wordsModelOf(document)).probe;

  return {
    model: m,
    problem: parsed.success ? undefined : parsed.error.issues[0]?.message,
    size: { width, height },
    pictureUrl: pictureUrl ?? undefined,
    points,
    parts,
    connectors,
    sections,
    cautions: m?.cautions ?? [],
    netLabel,
    pointOf,
  };
}

/** The net a probe sits on: a test point id resolves to its net; anything else is already a net. */
export function netOf(view: BoardView, netOrPoint: string): string {
  const p = view.pointOf(netOrPoint);
  return p && p.id.toLowerCase() === netOrPoint.toLowerCase() ? p.net : netOrPoint;
}
