import type { StoredReading } from '@splitscope/contract';
import { Caution } from '@/components/ui/caution';
import { MarkerGlyph } from '@/components/board-map/marker-glyph';
import { readingText } from '@/lib/format';
import type { BoardView } from '@/lib/board/board-view';
import { describeTest, stateOf, type Target } from '../lib/bench-model';
import type { NextTestView } from './ranking-panel';

/** One step at a time from the engine's next tests, with the steps already done and their readings. */
export function GuidedOrder({
  view,
  step,
  done,
  pending,
  children,
}: {
  /** The engine is still working out the first step. */
  pending?: boolean;
  view: BoardView;
  step: (NextTestView & { target: Target }) | undefined;
  done: StoredReading[];
  /** The gate or the reading panel for the current step. */
  children?: React.ReactNode;
}) {
  return (
    <section aria-labelledby="guided-h" className="space-y-3">
      <h2 id="guided-h" className="text-lg font-semibold">
        Guided order · step {done.length + 1}
      </h2>
      {step ? (
        <div className="space-y-2 rounded-lg border-2 border-board bg-white p-3" data-testid="guided-step">
          <p className="text-base font-semibold">{step.label}</p>
          {step.power === 'on' && (
            <Caution title="High voltage: this step is taken with the board powered">
              <p>Mains and the ~300 V DC bus are live. Keep one hand away, use insulated probes and follow your shop’s procedures.</p>
            </Caution>
          )}
        </div>
      ) : pending ? null : (
        <p className="rounded-md bg-board-light p-3">The engine has no further test to suggest: ask your lead to look at the ranking.</p>
      )}
      {children}
      <details aria-labelledby="done-h">
        <summary id="done-h" className="min-h-11 cursor-pointer text-base font-semibold">
          Steps done ({done.length})
        </summary>
        {done.length === 0 ? (
          <p className="text-sm text-stone-700">None yet.</p>
        ) : (
          <ol className="list-decimal space-y-1 pl-6 text-sm">
            {done.map((r) => (
              <li key={r.id}>
                <span className="inline-flex items-center gap-1">
                  <MarkerGlyph state={stateOf(r.verdict?.verdict)} />
                  {describeTest(view, { ...r, red: r.red, black: r.black })}: <span className="font-mono font-semibold">{readingText(r)}</span>
                  {r.verdict && <span>({r.verdict.verdict === 'ok' ? 'healthy' : r.verdict.verdict})</span>}
                </span>
              </li>
            ))}
          </ol>
        )}
      </details>
    </section>
  );
}
