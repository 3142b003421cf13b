import type Konva from 'konva';
import { useCallback, useLayoutEffect, useRef, type RefObject } from 'react';
import { fitView, type Size, type View } from '@/lib/map-geometry';

/**
 * The view transform lives on the Konva stage, not in React state: a wheel step or a drag frame then costs one
 * canvas redraw and no render. The map element's data-scale / data-offset attributes mirror it for tests and tools.
 */
export function useMapView(box: RefObject<HTMLDivElement | null>, board: Size, stageSize: Size) {
  const stage = useRef<Konva.Stage>(null);
  /** Until the user moves the view it follows the fit, so a late layout resize still shows the whole board. */
  const moved = useRef(false);

  const read = useCallback((): View => {
    const st = stage.current;
    return st ? { scale: st.scaleX(), x: st.x(), y: st.y() } : { scale: 1, x: 0, y: 0 };
  }, []);

  const mirror = useCallback(() => {
    const st = stage.current;
    const el = box.current;
    if (!st || !el) return;
    el.dataset.scale = st.scaleX().toFixed(3);
    el.dataset.offset = `${Math.round(st.x())},${Math.round(st.y())}`;
  }, [box]);

  const apply = useCallback(
    (v: View, byUser = true) => {
      const st = stage.current;
      if (!st) return;
      if (byUser) moved.current = true;
      st.scaleX(v.scale);
      st.scaleY(v.scale);
      st.x(v.x);
      st.y(v.y);
      mirror();
      st.batchDraw();
    },
    [mirror],
  );

  const { width: bw, height: bh } = board;
  const { width: sw, height: sh } = stageSize;
  useLayoutEffect(() => {
    if (sw > 0 && sh > 0 && !moved.current) apply(fitView({ width: bw, height: bh }, { width: sw, height: sh }), false);
  }, [bw, bh, sw, sh, apply]);

  /** After a drag Konva has moved the stage itself; record that the user owns the view now. */
  const dragged = useCallback(() => {
    moved.current = true;
    mirror();
  }, [mirror]);

  return { stage, read, apply, dragged };
}
