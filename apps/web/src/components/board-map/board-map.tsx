import Konva from 'konva';
import { useCallback, useEffect, useLayoutEffect, useMemo, useRef, useState, type KeyboardEvent } from 'react';
import { Layer, Shape, Stage } from 'react-konva';
import { MarkerGlyph } from './marker-glyph';
import { connectorObstacles, labelHeights, labelWidths, PROBE, PROBE_TAG, type OverlayScene } from './overlay-draw';
import { labelSprite } from './sprites';
import { OverlayCache } from './overlay-cache';
import { nearest } from './pick';
import type { MapConnector, MapPart, MapPoint } from './types';
import { useMapView } from './use-map-view';
import { usePicture } from './use-picture';
import { MARKER, keyToView, pinchView, zoomAt, type MarkerState, type Size, type Vec, type View } from '@/lib/map-geometry';

export type { MapConnector, MapPart, MapPoint } from './types';

export interface BoardMapProps {
  pictureUrl?: string;
  size: Size;
  points: MapPoint[];
  parts: MapPart[];
  connectors: MapConnector[];
  selectedId?: string | null;
  /** Nets where the red and the black probe go. */
  probes?: { red?: string; black?: string };
  highlightPart?: string | null;
  onSelect: (pointId: string) => void;
  /** Editing: test points can be dragged; the new board position is reported. */
  onPointMove?: (pointId: string, x: number, y: number) => void;
  /** Editing: a click on empty board reports the board position. */
  onBoardClick?: (x: number, y: number) => void;
}

function useElementSize<T extends HTMLElement>() {
  const ref = useRef<T>(null);
  const [size, setSize] = useState<Size>({ width: 0, height: 0 });
  useLayoutEffect(() => {
    const el = ref.current;
    if (!el) return;
    const ro = new ResizeObserver(([e]) => {
      if (e) setSize({ width: Math.round(e.contentRect.width), height: Math.round(e.contentRect.height) });
    });
    ro.observe(el);
    return () => ro.disconnect();
  }, []);
  return [ref, size] as const;
}

let measurer: CanvasRenderingContext2D | null = null;
const widths = new Map<string, number>();
function measure(text: string, font: string): number {
  const key = `${font}|${text}`;
  let w = widths.get(key);
  if (w === undefined) {
    measurer ??= document.createElement('canvas').getContext('2d');
    if (measurer) measurer.font = font;
    w = Math.ceil(measurer?.measureText(text).width ?? text.length * 8);
    widths.set(key, w);
  }
  return w;
}

const MARKER_REACH = 22; // screen px: a fingertip, not a pixel
const PIN_REACH = 10;
const DRAG_SLOP = 3; // screen px a press may wander and still be a click, as for Konva's own drags
const NO_PROBES: { red?: string; black?: string } = {};

/**
 * The board map: the board picture, parts, connectors and markers drawn by one custom shape on a single layer. Pan by dragging, zoom by wheel or pinch, and by keyboard when focused (+ − arrows, 0 fits).
 * Pointer hits are found by distance, so no canvas hit graph is kept.
 */
export function BoardMap(props: BoardMapProps) {
  const { size: board, points, parts, connectors, selectedId = null, probes = NO_PROBES, highlightPart = null, onSelect, onPointMove, onBoardClick } = props;
  const picture = usePicture(props.pictureUrl, board);
  const [box, stageSize] = useElementSize<HTMLDivElement>();
  const { stage, read, apply, dragged } = useMapView(box, board, stageSize);
  const [hover, setHover] = useState<{ net: string; point: number } | null>(null);
  const pinch = useRef<[Vec, Vec] | null>(null);
  /** A point being dragged: where the press was (screen) and the point's offset from the pointer (board), kept while it moves. */
  const drag = useRef<{ i: number; from: Vec; dx: number; dy: number; moved: boolean } | null>(null);
  const swallowClick = useRef(false);
  /** From a second finger landing until a new one-finger touch: the taps Konva reports as those fingers lift end a pinch. */
  const multiTouch = useRef(false);
  const ready = stageSize.width > 0 && stageSize.height > 0;

  const { red, black } = probes;
  const pins = useMemo(() => connectors.flatMap((c) => c.pins), [connectors]);
  const labelInput = useMemo(
    () => ({
      xs: Float32Array.from(points, (p) => p.x),
      ys: Float32Array.from(points, (p) => p.y),
      widths: labelWidths(points, { red, black }, measure),
      heights: labelHeights(points, { red, black }),
      board: { width: board.width, height: board.height },
      markerHalf: 12,
      gap: 13,
      obstacles: connectorObstacles(connectors, measure),
    }),
    [points, red, black, connectors, board.width, board.height],
  );

  useEffect(() => {
    // Draw the label bitmaps while the page is idle, so the first zoom that shows a label does not pay for it.
    if (typeof window.requestIdleCallback !== 'function') return;
    const pr = Konva.pixelRatio || window.devicePixelRatio || 1;
    let i = 0;
    let id = 0;
    const step = (d: IdleDeadline) => {
      for (; i < points.length && d.timeRemaining() > 2; i++) {
        const p = points[i]!;
        const tag = p.net === red ? PROBE_TAG.red : p.net === black ? PROBE_TAG.black : null;
        labelSprite(p.label, tag, labelInput.widths[i]!, labelInput.heights[i]!, pr);
      }
      if (i < points.length) id = window.requestIdleCallback(step);
    };
    id = window.requestIdleCallback(step);
    return () => window.cancelIdleCallback(id);
  }, [points, red, black, labelInput]);

  const scene = useRef<OverlayScene | null>(null);
  /** Bumped on every change to what is drawn, so the cached picture of the map is redrawn. */
  const version = useRef(0);
  const overlay = useRef<Konva.Layer>(null);
  useLayoutEffect(() => {
    const prev = scene.current;
    scene.current = {
      board,
      picture,
      points,
      parts,
      connectors,
      selectedId,
      highlightPart,
      probes,
      hoverNet: hover?.net ?? null,
      hoverPoint: hover?.point ?? -1,
      drag: prev?.drag ?? null,
      labels: labelInput,
      layout: prev?.labels === labelInput ? prev.layout : null,
    };
    version.current++;
    overlay.current?.batchDraw();
  });

  const view = useRef<View>({ scale: 1, x: 0, y: 0 });
  const cache = useRef(new OverlayCache());
  const sceneFunc = useCallback((ctx: Konva.Context, shape: Konva.Shape) => {
    const st = shape.getStage();
    const s = scene.current;
    if (!st || !s) return;
    const pr = shape.getLayer()?.getCanvas().getPixelRatio() ?? 1;
    ctx._context.setTransform(pr, 0, 0, pr, 0, 0);
    view.current.scale = st.scaleX();
    view.current.x = st.x();
    view.current.y = st.y();
    cache.current.draw(ctx._context, s, version.current, view.current, st.width(), st.height(), pr);
  }, []);

  useEffect(() => {
    // Bring a part the user picked in the ranking into view.
    if (!highlightPart || !ready) return;
    const p = parts.find((x) => x.id === highlightPart);
    if (!p) return;
    const s = Math.max(read().scale, 1);
    apply({ scale: s, x: stageSize.width / 2 - (p.x + p.width / 2) * s, y: stageSize.height / 2 - (p.y + p.height / 2) * s });
  }, [highlightPart, parts, ready, stageSize, read, apply]);

  const onKeyDown = (e: KeyboardEvent) => {
    const next = keyToView(e.key, read(), stageSize, board);
    if (next) {
      e.preventDefault();
      apply(next);
    }
  };

  const onWheel = (e: Konva.KonvaEventObject<WheelEvent>) => {
    e.evt.preventDefault();
    const p = stage.current?.getPointerPosition();
    if (p) apply(zoomAt(read(), p, e.evt.deltaY < 0 ? 1.15 : 1 / 1.15));
  };

  /** The point (or else connector pin) under the pointer, by distance in screen pixels. */
  const pick = () => {
    const p = stage.current?.getPointerPosition();
    if (!p) return null;
    const v = read();
    const i = nearest(points, v, p.x, p.y, MARKER_REACH);
    if (i >= 0) return { point: i, net: points[i]!.net };
    const j = nearest(pins, v, p.x, p.y, PIN_REACH);
    return j >= 0 ? { point: -1, net: pins[j]!.net } : null;
  };

  const onPointerMove = () => {
    const st = stage.current;
    if (!st || st.isDragging() || pinch.current) return;
    const d = drag.current;
    const s = scene.current;
    if (d && s) {
      const pos = st.getRelativePointerPosition();
      const at = st.getPointerPosition();
      if (!pos || !at) return;
      if (!d.moved && Math.hypot(at.x - d.from.x, at.y - d.from.y) < DRAG_SLOP) return;
      d.moved = true;
      s.drag = { i: d.i, x: pos.x + d.dx, y: pos.y + d.dy };
      version.current++;
      overlay.current?.batchDraw();
      return;
    }
    const h = pick();
    if (h?.net !== hover?.net || h?.point !== hover?.point) {
      setHover(h);
      st.container().style.cursor = h && h.point >= 0 ? 'pointer' : '';
    }
  };

  // A pointer event, so it runs before the mousedown / touchstart that would start a pan, and never for the mouse
  // events a browser sends after a tap.
  const onPointerDown = (e: Konva.KonvaEventObject<PointerEvent>) => {
    const st = stage.current;
    // A drag released outside the map got no click to swallow; this press is a new one.
    swallowClick.current = false;
    if (!onPointMove || !st || !e.evt.isPrimary || e.evt.button > 0) return;
    const h = pick();
    const at = st.getPointerPosition();
    const pos = st.getRelativePointerPosition();
    if (!h || h.point < 0 || !at || !pos) return;
    // Editing: this press moves the point, not the board.
    st.draggable(false);
    const p = points[h.point]!;
    drag.current = { i: h.point, from: at, dx: p.x - pos.x, dy: p.y - pos.y, moved: false };
  };

  /** A point drag given up (a second finger came): the point stays where it was. */
  const dropPointDrag = () => {
    if (!drag.current) return;
    drag.current = null;
    stage.current?.draggable(true);
    if (scene.current) scene.current.drag = null;
    version.current++;
    overlay.current?.batchDraw();
  };

  const endPointDrag = useCallback(() => {
    const d = drag.current;
    const s = scene.current;
    if (!d) return;
    drag.current = null;
    stage.current?.draggable(true);
    const at = s?.drag;
    if (s) s.drag = null;
    version.current++;
    if (d.moved && at) {
      swallowClick.current = true;
      onPointMove?.(points[d.i]!.id, Math.round(at.x), Math.round(at.y));
    }
    overlay.current?.batchDraw();
  }, [onPointMove, points, stage]);

  useEffect(() => {
    // A point drag that ends outside the map still ends.
    window.addEventListener('pointerup', endPointDrag);
    return () => window.removeEventListener('pointerup', endPointDrag);
  }, [endPointDrag]);

  const onClick = () => {
    if (swallowClick.current) {
      swallowClick.current = false;
      return;
    }
    const h = pick();
    if (h && h.point >= 0) return onSelect(points[h.point]!.id);
    if (h || !onBoardClick) return;
    const pos = stage.current?.getRelativePointerPosition();
    if (pos) onBoardClick(Math.round(pos.x), Math.round(pos.y));
  };

  const touches = (e: TouchEvent): [Vec, Vec] | null => {
    const r = (e.target as HTMLElement).getBoundingClientRect?.();
    const [a, b] = [e.touches[0], e.touches[1]];
    if (!a || !b || !r) return null;
    return [
      { x: a.clientX - r.left, y: a.clientY - r.top },
      { x: b.clientX - r.left, y: b.clientY - r.top },
    ];
  };
  const onTouchStart = (e: Konva.KonvaEventObject<TouchEvent>) => {
    const t = touches(e.evt);
    if (!t) {
      if (e.evt.touches.length === 1) multiTouch.current = false;
      return;
    }
    // The pinch is measured from the moment the second finger lands, or its first movement is lost.
    multiTouch.current = true;
    dropPointDrag();
    stage.current?.stopDrag();
    pinch.current = t;
  };
  const onTap = () => {
    if (!multiTouch.current) onClick();
  };
  const onTouchMove = (e: Konva.KonvaEventObject<TouchEvent>) => {
    const t = touches(e.evt);
    if (!t) return onPointerMove();
    e.evt.preventDefault();
    stage.current?.stopDrag();
    if (pinch.current) apply(pinchView(read(), pinch.current, t));
    pinch.current = t;
  };

  const legend = useMemo(() => (Object.keys(MARKER) as MarkerState[]).map((s) => ({ s, ...MARKER[s] })), []);

  return (
    <div className="relative h-full min-h-72 w-full overflow-hidden rounded-lg border border-stone-300 bg-board-light">
      <div
        ref={box}
        tabIndex={0}
        role="application"
        aria-label="Board map. Plus and minus zoom, arrow keys pan, 0 fits the board. Use the test-point list to pick a point."
        aria-roledescription="board map"
        data-testid="board-map"
        onKeyDown={onKeyDown}
        className="absolute inset-0 touch-none"
      >
        {ready && (
          <Stage
            ref={stage}
            width={stageSize.width}
            height={stageSize.height}
            draggable
            onDragEnd={dragged}
            onWheel={onWheel}
            onMouseMove={onPointerMove}
            onPointerDown={onPointerDown}
            onMouseLeave={() => hover && setHover(null)}
            onClick={onClick}
            onTap={onTap}
            onTouchStart={onTouchStart}
            onTouchMove={onTouchMove}
            onTouchEnd={(e) => e.evt.touches.length < 2 && (pinch.current = null)}
          >
            <Layer ref={overlay} listening={false}>
              <Shape sceneFunc={sceneFunc} listening={false} perfectDrawEnabled={false} shadowForStrokeEnabled={false} />
            </Layer>
          </Stage>
        )}
      </div>
      <ul className="pointer-events-none absolute bottom-2 left-2 flex flex-wrap gap-2 rounded-md bg-white/90 px-2 py-1 text-xs" aria-hidden>
        {legend.map((l) => (
          <li key={l.s} className="flex items-center gap-1">
            <MarkerGlyph state={l.s} /> {l.label}
          </li>
        ))}
        <li className="flex items-center gap-1">
          <span className="inline-block h-3 w-3 rounded-full border-2" style={{ borderColor: PROBE.red }} /> red probe
        </li>
        <li className="flex items-center gap-1">
          <span className="inline-block h-3 w-3 rounded-full border-2" style={{ borderColor: PROBE.black }} /> black probe
        </li>
      </ul>
      {hover && (
        <p className="pointer-events-none absolute top-2 left-2 rounded bg-ink/85 px-2 py-1 text-sm text-white">net {hover.net}</p>
      )}
    </div>
  );
}
