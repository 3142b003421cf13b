import { MARKER, type MarkerState } from '@/lib/map-geometry';
import { MarkerGlyph } from '@/components/board-map/marker-glyph';

export interface PointListItem {
  id: string;
  label: string;
  section?: string;
  state: MarkerState;
  reading?: string;
}

/** The accessible twin of the map: every test point as a button, in board order. */
export function PointList({ items, selectedId, onSelect }: { items: PointListItem[]; selectedId?: string | null; onSelect: (id: string) => void }) {
  return (
    <nav aria-label="Test points">
      <h2 className="mb-1 text-sm font-semibold text-stone-700">Test points</h2>
      <ul className="grid max-h-72 grid-cols-1 gap-1 overflow-auto sm:grid-cols-2">
        {items.map((p) => (
          <li key={p.id}>
            <button
              type="button"
              onClick={() => onSelect(p.id)}
              aria-current={selectedId === p.id ? 'true' : undefined}
              className={`flex min-h-11 w-full items-center gap-2 rounded-md border px-2 text-left text-sm ${selectedId === p.id ? 'border-copper bg-amber-50 font-semibold' : 'border-stone-300 bg-white hover:bg-stone-50'}`}
            >
              <MarkerGlyph state={p.state} />
              <span className="flex-1">
                {p.label}
                {p.section && <span className="block text-xs font-normal text-stone-700">{p.section}</span>}
              </span>
              <span className="text-xs">
                {p.reading ? <span className="font-mono">{p.reading}</span> : null} <span className="sr-only">{MARKER[p.state].label}</span>
              </span>
            </button>
          </li>
        ))}
      </ul>
    </nav>
  );
}
