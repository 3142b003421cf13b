import { useEffect, useLayoutEffect, useMemo, useRef, useState } from 'react';
import { Layer, Shape, Stage } from 'react-konva';
import { MarkerGlyph } from './marker-glyph';
import { PROBE } from './overlay-draw';
import type { MapConnector, MapPart, MapPoint } from './types';
import { useMapGestures, type Hover } from './use-map-gestures';
import { useMapScene } from './use-map-scene';
import { useMapView } from './use-map-view';
import { usePicture } from './use-picture';
import { MARKER, type MarkerState, type Size } from '@/lib/map-geometry';

export type { MapConnector, MapPart, MapPoint } from './types';

const NO_PROBES: { red?: string; black?: string } = {};

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

/**
 * The board map: the board picture, parts, connectors and markers drawn by one custom shape on a single layer
 * (use-map-scene.ts), moved and picked by hand and keys (use-map-gestures.ts); this file puts them on the page.
 */
export function BoardMap(props: BoardMapProps) {
  const { size: board, points, parts, connectors, selectedId = null, probes = NO_PROBES, highlightPart = null, onSelect, onPointMove, onBoardClick } = props;
  const picture = usePicture(props.pictureUrl, board);
  const [box, stageSize] = useElementSize<HTMLDivElement>();
  const { stage, read, apply, dragged } = useMapView(box, board, stageSize);
  const ready = stageSize.width > 0 && stageSize.height > 0;
  // What the pointer is over: found by the gestures, drawn by the scene.
  const [hover, setHover] = useState<Hover>(null);
  const { overlay, sceneFunc, setDrag, dragAt } = useMapScene({ board, picture, points, parts, connectors, selectedId, highlightPart, probes, hover });
  const gestures = useMapGestures({
    stage,
    read,
    apply,
    board,
    stageSize,
    points,
    connectors,
    onSelect,
    onPointMove,
    onBoardClick,
    setDrag,
    dragAt,
    hover,
    setHover,
  });

  useEffect(() => {
    // Bring a part the user picked in the ranking into view.
    if (!highlightPart || !ready) return;
    const p = parts.find((x) => x.id === highlightPart);
    if (!p) return;
    const s = Math.max(read().scale, 1);
    apply({ scale: s, x: stageSize.width / 2 - (p.x + p.width / 2) * s, y: stageSize.height / 2 - (p.y + p.height / 2) * s });
  }, [highlightPart, parts, ready, stageSize, read, apply]);

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
        onKeyDown={gestures.onKeyDown}
        className="absolute inset-0 touch-none"
      >
        {ready && (
          <Stage ref={stage} width={stageSize.width} height={stageSize.height} draggable onDragEnd={dragged} {...gestures.stageHandlers}>
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
      {gestures.hoverText && <p className="pointer-events-none absolute top-2 left-2 rounded bg-ink/85 px-2 py-1 text-sm text-white">{gestures.hoverText}</p>}
    </div>
  );
}
