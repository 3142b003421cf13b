import { useMemo, useState } from 'react';
import { BoardMap } from '@/components/board-map/board-map';
import { syntheticBoard } from './synthetic-board';

/**
 * Development page for the front-end budget (`npm run bench:web`): the bench's own board map with a synthetic
 * board of `?points=` test points (1,000 by default). No data is loaded and nothing is saved.
 */
export default function PerfLabPage() {
  const count = Math.min(5000, Math.max(1, Number(new URLSearchParams(window.location.search).get('points')) || 1000));
  const board = useMemo(() => syntheticBoard(count), [count]);
  const [selected, setSelected] = useState<string | null>(null);
  return (
    <main className="flex h-screen flex-col">
      <h1 className="px-4 py-2 text-sm font-semibold">
        Board map load check: {count} test points{selected ? `, ${selected} selected` : ''}
      </h1>
      <div className="min-h-0 flex-1" data-testid="perf-map">
        <BoardMap size={board.size} points={board.points} parts={board.parts} connectors={[]} selectedId={selected} onSelect={setSelected} />
      </div>
    </main>
  );
}
