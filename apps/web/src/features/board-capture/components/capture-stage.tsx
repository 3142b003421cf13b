import type { BoardCapture, BoardDraft } from '@splitscope/contract';
import { useEffect, useState } from 'react';
import { Circle, Group, Image as KImage, Label, Layer, Rect, Stage, Tag, Text } from 'react-konva';
import type { KonvaEventObject } from 'konva/lib/Node';

export type Tool = 'point' | 'connector' | 'section' | 'look';

/** The powered DC-volt value the engine computed for a point, as the photo labels it. */
export function poweredText(draft: BoardDraft | undefined, id: string): string | null {
  const row = draft?.points.find((p) => p.id === id)?.expected.find((e) => e.mode === 'dcv' && e.power === 'on');
  return row && typeof row.expected === 'number' ? `${row.expected.toPrecision(3)} V` : null;
}

/**
 * The photo with what is marked on it. A click places a test point or a connector; a drag marks a section's
 * region. Coordinates are photo pixels: the stage scales the photo to the width it is given.
 */
export function CaptureStage({
  capture,
  draft,
  tool,
  width,
  onPlace,
  onRegion,
  selected,
}: {
  capture: BoardCapture;
  draft: BoardDraft | undefined;
  tool: Tool;
  width: number;
  onPlace: (kind: 'point' | 'connector', x: number, y: number) => void;
  onRegion: (r: { x: number; y: number; w: number; h: number }) => void;
  selected: string | null;
}) {
  const { photo } = capture;
  const scale = width / photo.width;
  const [img, setImg] = useState<HTMLImageElement | null>(null);
  const [drag, setDrag] = useState<{ x: number; y: number; w: number; h: number } | null>(null);
  useEffect(() => {
    const i = new window.Image();
    i.onload = () => setImg(i);
    i.src = `/api/uploads/${encodeURIComponent(photo.uploadId)}`;
    return () => void (i.onload = null);
  }, [photo.uploadId]);

  const at = (e: KonvaEventObject<MouseEvent | TouchEvent>) => {
    const p = e.target.getStage()?.getPointerPosition();
    return p ? { x: Math.round(p.x / scale), y: Math.round(p.y / scale) } : null;
  };
  const down = (e: KonvaEventObject<MouseEvent | TouchEvent>) => {
    const p = at(e);
    if (!p) return;
    if (tool === 'section') setDrag({ x: p.x, y: p.y, w: 0, h: 0 });
    else if (tool === 'point' || tool === 'connector') onPlace(tool, p.x, p.y);
  };
  const move = (e: KonvaEventObject<MouseEvent | TouchEvent>) => {
    const p = at(e);
    if (drag && p) setDrag({ ...drag, w: p.x - drag.x, h: p.y - drag.y });
  };
  const up = () => {
    if (!drag) return;
    const r = { x: Math.min(drag.x, drag.x + drag.w), y: Math.min(drag.y, drag.y + drag.h), w: Math.abs(drag.w), h: Math.abs(drag.h) };
    setDrag(null);
    // A click without a drag marks nothing: a region is at least a few pixels of the photo.
    if (r.w > 8 && r.h > 8) onRegion(r);
  };
  const fs = 14 / scale;
  // Text width estimated from the character count (the stage's font is about 0.6 em per character).
  const labelX = (x: number, text: string) => {
    const w = text.length * 0.6 * fs + 4 / scale;
    return x + 12 / scale + w > photo.width ? x - 12 / scale - w : x + 12 / scale;
  };

  return (
    <Stage
      width={width}
      height={photo.height * scale}
      scaleX={scale}
      scaleY={scale}
      onMouseDown={down}
      onMouseMove={move}
      onMouseUp={up}
      onTouchStart={down}
      onTouchMove={move}
      onTouchEnd={up}
      style={{ cursor: tool === 'look' ? 'default' : 'crosshair' }}
    >
      <Layer listening={false}>
        {img ? <KImage image={img} width={photo.width} height={photo.height} /> : <Rect width={photo.width} height={photo.height} fill="#e7e5e4" />}
        {capture.sections.map((s) => (
          <Group key={s.id}>
            <Rect
              x={s.region.x}
              y={s.region.y}
              width={s.region.w}
              height={s.region.h}
              stroke={selected === s.id ? '#b45309' : '#0f766e'}
              strokeWidth={3 / scale}
              dash={[10 / scale, 6 / scale]}
            />
            {/* Kept inside its own region (cut short with an ellipsis), so neighbouring sections' titles never overlap. */}
            <Label x={s.region.x + 4 / scale} y={s.region.y + 4 / scale}>
              <Tag fill="rgba(0,0,0,0.7)" />
              <Text text={s.title || s.id} fontSize={fs} fill="#fff" padding={2 / scale} width={Math.max(s.region.w - 8 / scale, fs)} wrap="none" ellipsis />
            </Label>
          </Group>
        ))}
        {drag && <Rect x={drag.x} y={drag.y} width={drag.w} height={drag.h} stroke="#b45309" strokeWidth={2 / scale} />}
        {capture.connectors.map((c) => (
          <Group key={c.name}>
            <Rect x={c.x - 10 / scale} y={c.y - 10 / scale} width={20 / scale} height={20 / scale} fill="#1e3a8a" />
            <Text x={c.x + 12 / scale} y={c.y - 8 / scale} text={c.name} fontSize={fs} fill="#fff" stroke="#000" strokeWidth={0.5 / scale} />
          </Group>
        ))}
        {capture.points.map((p) => {
          const v = poweredText(draft, p.id);
          return (
            <Group key={p.id}>
              <Circle
                x={p.x}
                y={p.y}
                radius={9 / scale}
                fill={v ? '#15803d' : '#f59e0b'}
                stroke={selected === p.id ? '#000' : '#fff'}
                strokeWidth={2 / scale}
              />
              {/* White on a dark tag reads on any board colour; a label that would leave the photo goes left of its point. */}
              <Label x={labelX(p.x, v ? `${p.id} ${v}` : p.id)} y={p.y - 9 / scale}>
                <Tag fill="rgba(0,0,0,0.75)" />
                <Text text={v ? `${p.id} ${v}` : p.id} fontSize={fs} fill="#fff" padding={2 / scale} />
              </Label>
            </Group>
          );
        })}
      </Layer>
    </Stage>
  );
}
