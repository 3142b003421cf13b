import { boardWords, type StoredReading } from '@splitscope/contract';
import { useMemo, type ReactNode } from 'react';
import { bandText, boardStateText, dateTime, METER_LABEL, readingText, verdictWord } from '@/lib/format';
import { groupRepeats } from './group-repeats';

type Model = Parameters<typeof boardWords>[0];

/**
 * Readings as the bench reads them: where the probes were (test point, connector pin or part pin), the meter
 * function, the board's state (power, parts lifted), the value and the verdict. The same test taken again shows
 * as one row with its values; a corrected or struck reading stays listed, struck through, with who and when.
 */
export function ReadingsTable({
  readings,
  model,
  actions,
  caption,
}: {
  readings: StoredReading[];
  model: Model;
  actions?: (r: StoredReading) => ReactNode;
  caption?: string;
}) {
  const words = useMemo(() => boardWords(model), [model]);
  const groups = useMemo(() => groupRepeats(readings), [readings]);
  if (readings.length === 0) return <p className="text-sm text-stone-700">No reading yet.</p>;
  return (
    <table className="w-full text-left text-sm sm:[&_td]:pr-2 sm:[&_th]:pr-2" data-testid="readings-table">
      {caption && <caption className="sr-only">{caption}</caption>}
      <thead>
        <tr className="border-b border-stone-300">
          <th className="py-1">Probes</th>
          <th>Meter</th>
          <th>Board</th>
          <th>Read</th>
          <th>Expected</th>
          <th>Verdict</th>
          {actions && <th className="sr-only">Actions</th>}
        </tr>
      </thead>
      <tbody>
        {groups.map((g) => {
          const r = g.latest;
          return (
            <tr key={r.id} className="border-b border-stone-200 align-top" data-testid="reading-row">
              <td className="py-1">
                {r.alone ? (
                  words.probes(r)
                ) : (
                  <>
                    {words.probe(r.red)} <span className="text-stone-600">to</span> {words.probe(r.black)}
                  </>
                )}
              </td>
              <td>{METER_LABEL[r.mode]}</td>
              <td data-testid="board-state">{boardStateText({ power: r.power, lifted: r.lifted.map(words.designator) })}</td>
              <td className="font-mono">
                {g.items.map((x, i) => {
                  const gone = x.supersededBy !== null || x.struck !== null;
                  return (
                    <span key={x.id} className="block">
                      <span className={gone ? 'text-stone-500 line-through' : 'font-semibold'}>{readingText(x)}</span>
                      {x.struck && (
                        <span className="ml-1 font-sans text-xs text-stone-700">
                          struck by {x.struck.authorName}, {dateTime(x.struck.at)}: “{x.struck.reason}”
                        </span>
                      )}
                      {x.supersededBy && (
                        <span className="ml-1 font-sans text-xs text-stone-700">
                          corrected ({x.authorName}, {dateTime(x.createdAt)})
                        </span>
                      )}
                      {!gone && g.items.length > 1 && i === g.items.length - 1 && (
                        <span className="ml-1 font-sans text-xs text-stone-700">×{g.current} taken</span>
                      )}
                    </span>
                  );
                })}
              </td>
              <td className="tabular-nums">{r.verdict ? bandText(r.verdict, r.mode) : 'not computed'}</td>
              <td className="font-semibold">{r.struck ? 'struck out' : verdictWord(r.verdict?.verdict)}</td>
              {actions && <td>{actions(r)}</td>}
            </tr>
          );
        })}
      </tbody>
    </table>
  );
}
