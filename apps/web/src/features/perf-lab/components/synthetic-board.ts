import type { MapPart, MapPoint } from '@/components/board-map/board-map';
import type { MarkerState } from '@/lib/map-geometry';

const STATES: MarkerState[] = ['unmeasured', 'healthy', 'low', 'high'];

/**
 * An invented board for the front-end budget: `count` test points on a grid with a little deterministic
 * jitter, every marker state in turn, and one part per 10 points, so the map draws as much as a dense real board.
 */
export function syntheticBoard(count: number): { size: { width: number; height: number }; points: MapPoint[]; parts: MapPart[] } {
  const cols = Math.ceil(Math.sqrt(count * 1.6));
  const pitch = 24;
  const size = { width: (cols + 1) * pitch, height: (Math.ceil(count / cols) + 1) * pitch };
  const points: MapPoint[] = Array.from({ length: count }, (_, i) => ({
    id: `TP${i + 1}`,
    label: `TP${i + 1}`,
    x: ((i % cols) + 1) * pitch + ((i * 7) % 5) - 2,
    y: (Math.floor(i / cols) + 1) * pitch + ((i * 11) % 5) - 2,
    net: `N${i % 97}`,
    state: STATES[i % STATES.length]!,
  }));
  const parts: MapPart[] = Array.from({ length: Math.ceil(count / 10) }, (_, i) => ({
    id: `R${i + 1}`,
    x: points[i * 10]!.x + 4,
    y: points[i * 10]!.y + 4,
    width: 14,
    height: 6,
  }));
  return { size, points, parts };
}
