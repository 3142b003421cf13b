import { MARKER, markerPoints, type MarkerState } from '@/lib/map-geometry';

/** The same marker as on the map, for lists and legends. */
export function MarkerGlyph({ state }: { state: MarkerState }) {
  const m = MARKER[state];
  const pts = m.shape === 'ring' ? null : markerPoints(m.shape, 5.5);
  return (
    <svg width="18" height="18" viewBox="-9 -9 18 18" aria-hidden className="shrink-0">
      <circle r="7.5" fill="#fff" stroke={m.colour} strokeWidth="2" />
      {pts && (
        <polyline
          points={pts.join(' ')}
          fill={m.shape === 'check' ? 'none' : m.colour}
          stroke={m.colour}
          strokeWidth={m.shape === 'check' ? 2.2 : 1}
          strokeLinecap="round"
          strokeLinejoin="round"
        />
      )}
    </svg>
  );
}
