/**
 * How the board map answers the hand: pan by dragging, zoom by wheel, pinch or keys (+ − arrows, 0 fits), a tap
 * or click picks the nearest point, and in the editor a press on a point drags it. Hits are found by distance in
 * screen pixels (a fingertip, not a pixel), so no canvas hit graph is kept.
 */
import type Konva from 'konva';
import { useCallback, useEffect, useMemo, useRef, type KeyboardEvent, type RefObject } from 'react';
import { keyToView, pinchView, zoomAt, type Size, type Vec, type View } from '@/lib/map-geometry';
import type { OverlayScene } from './overlay-draw';
import { nearest } from './pick';
import type { MapConnector, MapPoint } from './types';

const MARKER_REACH = 22; // screen px: a fingertip, not a pixel
const PIN_REACH = 10;
const DRAG_SLOP = 3; // screen px a press may wander and still be a click, as for Konva's own drags

/** The test point (index) or connector pin (point −1) under the pointer, with its net. */
export type Hover = { net: string; point: number } | null;

export interface GestureInput {
  stage: RefObject<Konva.Stage | null>;
  read: () => View;
  apply: (v: View) => void;
  board: Size;
  stageSize: Size;
  points: MapPoint[];
  connectors: MapConnector[];
  onSelect: (pointId: string) => void;
  onPointMove?: (pointId: string, x: number, y: number) => void;
  onBoardClick?: (x: number, y: number) => void;
  setDrag: (drag: OverlayScene['drag']) => void;
  dragAt: () => OverlayScene['drag'];
  hover: Hover;
  setHover: (h: Hover) => void;
}

export function useMapGestures(g: GestureInput) {
  const { stage, read, apply, board, stageSize, points, connectors, onSelect, onPointMove, onBoardClick, setDrag, dragAt, hover, setHover } = g;
  const pinch = useRef<[Vec, Vec] | null>(null);
  /** A point being dragged: where the press was (screen) and the point's offset from the pointer (board), kept while it moves. */
  const drag = useRef<{ i: number; from: Vec; dx: number; dy: number; moved: boolean } | null>(null);
  const swallowClick = useRef(false);
  /** From a second finger landing until a new one-finger touch: the taps Konva reports as those fingers lift end a pinch. */
  const multiTouch = useRef(false);
  const pins = useMemo(() => connectors.flatMap((c) => c.pins.map((p) => ({ ...p, connector: c.id }))), [connectors]);

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
    if (d) {
      const pos = st.getRelativePointerPosition();
      const at = st.getPointerPosition();
      if (!pos || !at) return;
      if (!d.moved && Math.hypot(at.x - d.from.x, at.y - d.from.y) < DRAG_SLOP) return;
      d.moved = true;
      setDrag({ i: d.i, x: pos.x + d.dx, y: pos.y + d.dy });
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
    setDrag(null);
  };

  const endPointDrag = useCallback(() => {
    const d = drag.current;
    if (!d) return;
    drag.current = null;
    stage.current?.draggable(true);
    const at = dragAt();
    setDrag(null);
    if (d.moved && at) {
      swallowClick.current = true;
      onPointMove?.(points[d.i]!.id, Math.round(at.x), Math.round(at.y));
    }
  }, [onPointMove, points, stage, setDrag, dragAt]);

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
  const onTouchEnd = (e: Konva.KonvaEventObject<TouchEvent>) => {
    if (e.evt.touches.length < 2) pinch.current = null;
  };

  /** What the pointer is over, in the bench's words: the test point's label, or the connector pin ("CN3 pin 3"). */
  const hoverText = !hover
    ? null
    : hover.point >= 0
      ? (points[hover.point]?.label ?? null)
      : (() => {
          const pin = pins.find((p) => p.net === hover.net);
          return pin ? `${pin.connector} pin ${pin.label}` : null;
        })();

  const stageHandlers = {
    onWheel,
    onMouseMove: onPointerMove,
    onPointerDown,
    onMouseLeave: () => hover && setHover(null),
    onClick,
    onTap,
    onTouchStart,
    onTouchMove,
    onTouchEnd,
  };
  return { hoverText, onKeyDown, stageHandlers };
}
