import type { ExpectedReadingRow, StoredReading } from '@splitscope/contract';
import type { BoardView } from '@/lib/board/board-view';
import type { ChainLink } from '../components/signal-chain';
import { latestFor, stateOf } from './bench-model';

/** The signal chain's links: each powered DC-volt row of the expected table with its latest reading. */
export function chainLinks(view: BoardView, rows: ExpectedReadingRow[], readings: StoredReading[]): ChainLink[] {
  // The chain is the powered DC-volt rows in board order (the board model lists them bus first).
  return rows
    .filter((r) => r.mode === 'dcv' && r.power === 'on' && typeof r.expected === 'number' && r.low !== null && r.high !== null && r.lifted.length === 0)
    .map((r) => {
      const latest = latestFor(view, readings, r);
      const p = view.pointOf(r.red);
      return {
        id: r.id,
        // The test point first ("TP5 Fan control supply"): the chain's axis names each link by its point.
        label: p?.label ?? r.label ?? r.red,
        section: view.sections.find((s) => s.id === p?.section)?.name ?? p?.section ?? '',
        unit: r.unit,
        nominal: r.expected as number,
        low: r.low ?? 0,
        high: r.high ?? 0,
        measured: latest?.value ?? null,
        state: latest ? stateOf(latest.verdict?.verdict) : 'unmeasured',
      };
    });
}
