/**
 * What the board map draws: the scene (picture, parts, connectors, markers, labels and their layout) kept in a ref
 * and drawn by one Konva shape through the overlay cache. React renders only update the scene; a redraw is a
 * version bump and one batchDraw, so a drag or zoom frame costs no render.
 */
import Konva from 'konva';
import { useCallback, useEffect, useLayoutEffect, useMemo, useRef } from 'react';
import type { View } from '@/lib/map-geometry';
import { connectorObstacles, labelHeights, labelWidths, PROBE_TAG, shortLabel, type OverlayScene } from './overlay-draw';
import { OverlayCache } from './overlay-cache';
import { labelSprite } from './sprites';

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

/** What the page gives the scene: the overlay's own fields, and the hover the gestures found. */
export type SceneInput = Pick<OverlayScene, 'board' | 'picture' | 'points' | 'parts' | 'connectors' | 'selectedId' | 'highlightPart' | 'probes'> & {
  hover: { net: string; point: number } | null;
};

export function useMapScene(input: SceneInput) {
  const { board, picture, points, parts, connectors, selectedId, highlightPart, probes, hover } = input;
  const { red, black } = probes;
  const labelInput = useMemo(
    () => ({
      xs: Float32Array.from(points, (p) => p.x),
      ys: Float32Array.from(points, (p) => p.y),
      widths: labelWidths(points, { red, black }, measure),
      shortWidths: labelWidths(points, { red, black }, measure, shortLabel),
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

  /** Moves (or drops, with null) the point being dragged in the editor and redraws. */
  const setDrag = useCallback((drag: OverlayScene['drag']) => {
    if (scene.current) scene.current.drag = drag;
    version.current++;
    overlay.current?.batchDraw();
  }, []);
  const dragAt = useCallback(() => scene.current?.drag ?? null, []);

  return { overlay, sceneFunc, setDrag, dragAt };
}
