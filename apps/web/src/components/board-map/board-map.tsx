import type Konva from 'konva';
import { useEffect, useLayoutEffect, useMemo, useRef, useState, type KeyboardEvent } from 'react';
import { Circle, Group, Image as KonvaImage, Layer, Line, Rect, Stage, Text } from 'react-konva';
import { MarkerGlyph } from './marker-glyph';
import {
  MARKER,
  fitView,
  keyToView,
  markerPoints,
  pinchView,
  zoomAt,
  type MarkerState,
  type Size,
  type Vec,
  type View,
} from '@/lib/map-geometry';

export interface MapPoint {
  id: string;
  label: string;
  x: number;
  y: number;
  net: string;
  state: MarkerState;
}
export interface MapPart {
  id: string;
  x: number;
  y: number;
  width: number;
  height: number;
}
export interface MapConnector {
  id: string;
  x: number;
  y: number;
  pins: { label: string; x: number; y: number; net: string }[];
}

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

function usePicture(url?: string) {
  const [img, setImg] = useState<HTMLImageElement | null>(null);
  useEffect(() => {
    if (!url) return;
    const i = new window.Image();
    i.onload = () => setImg(i);
    i.src = url;
    return () => {
      i.onload = null;
    };
  }, [url]);
  return url ? img : null;
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

const PROBE = { red: '#c81e1e', black: '#111827' } as const;

/**
 * The board map: the board picture on its own static layer, markers, parts and connectors on the interactive
 * overlay. Pan by dragging, zoom by wheel or pinch, and by keyboard when focused (+ − arrows, 0 fits).
 */
export function BoardMap(props: BoardMapProps) {
  const { size: board, points, parts, connectors, selectedId, probes, highlightPart, onSelect } = props;
  const picture = usePicture(props.pictureUrl);
  const [box, stage] = useElementSize<HTMLDivElement>();
  const [view, setView] = useState<View | null>(null);
  const [hoverNet, setHoverNet] = useState<string | null>(null);
  const pinch = useRef<[Vec, Vec] | null>(null);
  const ready = stage.width > 0 && stage.height > 0;

  // First fit once the stage has a size; later resizes keep the user's view.
  const current = view ?? (ready ? fitView(board, stage) : { scale: 1, x: 0, y: 0 });
  const k = 1 / current.scale; // markers keep their size on screen

  useEffect(() => {
    // Bring a part the user picked in the ranking into view.
    if (!highlightPart || !ready) return;
    const p = parts.find((x) => x.id === highlightPart);
    if (!p) return;
    setView((v) => {
      const s = Math.max((v ?? fitView(board, stage)).scale, 1);
      return { scale: s, x: stage.width / 2 - (p.x + p.width / 2) * s, y: stage.height / 2 - (p.y + p.height / 2) * s };
    });
  }, [highlightPart, parts, ready, board, stage]);

  const onKeyDown = (e: KeyboardEvent) => {
    const next = keyToView(e.key, current, stage, board);
    if (next) {
      e.preventDefault();
      setView(next);
    }
  };

  const onWheel = (e: Konva.KonvaEventObject<WheelEvent>) => {
    e.evt.preventDefault();
    const p = e.target.getStage()?.getPointerPosition();
    if (p) setView(zoomAt(current, p, e.evt.deltaY < 0 ? 1.15 : 1 / 1.15));
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
  const onTouchMove = (e: Konva.KonvaEventObject<TouchEvent>) => {
    const t = touches(e.evt);
    if (!t) return;
    e.evt.preventDefault();
    e.target.getStage()?.stopDrag();
    if (pinch.current) setView(pinchView(current, pinch.current, t));
    pinch.current = t;
  };

  const hoverHandlers = (net: string) => ({
    onMouseEnter: () => setHoverNet(net),
    onMouseLeave: () => setHoverNet(null),
  });
  const netLit = (net: string) => hoverNet === net || probes?.red === net || probes?.black === net;
  const probeOf = (net: string) => (probes?.red === net ? 'red' : probes?.black === net ? 'black' : null);

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
        data-scale={current.scale.toFixed(3)}
        data-offset={`${Math.round(current.x)},${Math.round(current.y)}`}
        onKeyDown={onKeyDown}
        className="absolute inset-0 touch-none"
      >
        {ready && (
          <Stage
            width={stage.width}
            height={stage.height}
            scaleX={current.scale}
            scaleY={current.scale}
            x={current.x}
            y={current.y}
            draggable
            onDragEnd={(e) => {
              if (e.target === e.target.getStage()) setView({ ...current, x: e.target.x(), y: e.target.y() });
            }}
            onWheel={onWheel}
            onClick={(e) => {
              if (!props.onBoardClick || e.target !== e.target.getStage()) return;
              const pos = e.target.getStage()?.getRelativePointerPosition();
              if (pos) props.onBoardClick(Math.round(pos.x), Math.round(pos.y));
            }}
            onTouchMove={onTouchMove}
            onTouchEnd={() => (pinch.current = null)}
          >
            <Layer listening={false}>
              <Rect width={board.width} height={board.height} fill="#1f5f4a" cornerRadius={8} />
              {picture && <KonvaImage image={picture} width={board.width} height={board.height} />}
            </Layer>
            <Layer>
              {parts.map((p) => (
                <Rect
                  key={p.id}
                  x={p.x}
                  y={p.y}
                  width={p.width}
                  height={p.height}
                  stroke={highlightPart === p.id ? '#f5c542' : 'rgba(255,255,255,0.35)'}
                  strokeWidth={(highlightPart === p.id ? 4 : 1) * k}
                  dash={highlightPart === p.id ? undefined : [4 * k, 4 * k]}
                  listening={false}
                />
              ))}
              {highlightPart &&
                parts
                  .filter((p) => p.id === highlightPart)
                  .map((p) => (
                    <Text key={p.id} x={p.x} y={p.y - 20 * k} text={p.id} fontSize={16 * k} fontStyle="bold" fill="#f5c542" />
                  ))}
              {connectors.map((c) => (
                <Group key={c.id}>
                  <Text x={c.x} y={c.y - 18 * k} text={c.id} fontSize={13 * k} fill="#ffffff" fontStyle="bold" />
                  {c.pins.map((pin) => {
                    const lit = netLit(pin.net);
                    const probe = probeOf(pin.net);
                    return (
                      <Group key={pin.label} x={pin.x} y={pin.y} {...hoverHandlers(pin.net)}>
                        <Rect
                          x={-7 * k}
                          y={-7 * k}
                          width={14 * k}
                          height={14 * k}
                          fill={probe ? PROBE[probe] : lit ? '#f5c542' : '#d6a756'}
                          stroke="#111827"
                          strokeWidth={1 * k}
                        />
                        <Text x={9 * k} y={-6 * k} text={pin.label} fontSize={11 * k} fill="#ffffff" />
                      </Group>
                    );
                  })}
                </Group>
              ))}
              {points.map((p) => {
                const m = MARKER[p.state];
                const lit = netLit(p.net);
                const probe = probeOf(p.net);
                const r = 10 * k;
                return (
                  <Group
                    key={p.id}
                    x={p.x}
                    y={p.y}
                    onClick={() => onSelect(p.id)}
                    onTap={() => onSelect(p.id)}
                    draggable={!!props.onPointMove}
                    onDragEnd={(e) => {
                      e.cancelBubble = true;
                      props.onPointMove?.(p.id, Math.round(e.target.x()), Math.round(e.target.y()));
                    }}
                    {...hoverHandlers(p.net)}
                  >
                    {/* generous invisible hit area: a fingertip, not a pixel */}
                    <Circle radius={22 * k} fill="rgba(0,0,0,0.001)" />
                    {(lit || selectedId === p.id) && (
                      <Circle radius={16 * k} stroke={probe ? PROBE[probe] : '#f5c542'} strokeWidth={4 * k} />
                    )}
                    <Circle radius={r} fill="#ffffff" stroke={m.colour} strokeWidth={3 * k} />
                    {m.shape !== 'ring' && (
                      <Line
                        points={markerPoints(m.shape, r * 0.75)}
                        closed={m.shape !== 'check'}
                        fill={m.shape !== 'check' ? m.colour : undefined}
                        stroke={m.colour}
                        strokeWidth={(m.shape === 'check' ? 3 : 1) * k}
                        lineCap="round"
                        lineJoin="round"
                      />
                    )}
                    <Text x={13 * k} y={-7 * k} text={p.label} fontSize={13 * k} fill="#ffffff" fontStyle="bold" />
                    {probe && (
                      <Text x={13 * k} y={8 * k} text={probe === 'red' ? 'RED +' : 'BLACK −'} fontSize={11 * k} fill="#ffffff" />
                    )}
                  </Group>
                );
              })}
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
      {hoverNet && (
        <p className="pointer-events-none absolute top-2 left-2 rounded bg-ink/85 px-2 py-1 text-sm text-white">net {hoverNet}</p>
      )}
    </div>
  );
}

