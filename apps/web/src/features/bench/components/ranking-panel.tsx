import { useState } from 'react';
export interface RankedPart {
  part: string;
  /** The fault in the bench's words ("U1 opto — LED open"). */
  label: string;
  /** The designator printed on the board: what is proposed, repaired and reported. */
  designator: string;
  mode: string;
  probability: number;
  description?: string;
  evidenceFor: string[];
  evidenceAgainst: string[];
  /** Fault pairs with this fault are still being checked. */
  checking?: boolean;
}

export interface NextTestView {
  id: string;
  label: string;
  meter: string;
  power: 'on' | 'off';
  red: string;
  black: string;
  /** Expected information gain in bits, as the engine reports it. */
  gainBits?: number;
  pointId?: string;
}

const SHORT_LIST = 8;
const pct = (p: number) => `${(p * 100).toFixed(p < 0.1 ? 1 : 0)} %`;

/** The engine's ranking of probable faulty parts and its best next tests. */
export function RankingPanel({
  parts,
  nextTests,
  selectedPart,
  onPickPart,
  onPickTest,
  before,
  suspectSections = [],
  reasons = [],
  guided = false,
  preparing,
  checkingPairs,
  readingsKey,
}: {
  parts: RankedPart[];
  nextTests: NextTestView[];
  selectedPart?: string | null;
  onPickPart: (part: string) => void;
  onPickTest?: (t: NextTestView) => void;
  /** Before the first reading: what the fault code points at, instead of every part of the board at equal odds. */
  before?: { code: string | null; meaning: string | null; sections: string[]; firstTest: string | null } | null;
  /** In guided order the one step to take is the guided step beside the map, not a list to choose from. */
  guided?: boolean;
  /** The board's sections by the likelihood of a fault there (before the first reading). */
  suspectSections?: { name: string; share: number }[];
  /** Why this job's priors moved (fault code, the shop's history), one line per reason. */
  reasons?: { text: string; parts: string[]; source: string }[];
  /** The board's expected values for every fault are still being computed (parts done of the total). */
  preparing?: { partsDone: number; partsTotal: number };
  /** How many fault pairs are still being checked. */
  checkingPairs?: number;
  /** Which readings the ranking was made from (count:last reading id), on the page for a benchmark to watch. */
  readingsKey?: string;
}) {
  // With no readings every part is equally suspect: a list of a hundred parts helps nobody, so show the leaders.
  const [all, setAll] = useState(false);
  const shown = all ? parts : parts.slice(0, SHORT_LIST);
  return (
    <div className="grid gap-3 sm:grid-cols-2" data-testid="ranking" data-readings={readingsKey}>
      <section aria-labelledby="next-h">
        <h2 id="next-h" className="mb-1 text-base font-semibold">
          Next tests
        </h2>
        {guided ? (
          <p className="text-sm text-stone-700">Guided order: take the step shown beside the map.</p>
        ) : nextTests.length === 0 ? (
          <p className="text-sm text-stone-700">No further test would change the ranking.</p>
        ) : (
          <ol className="space-y-1">
            {nextTests.map((t) => (
              <li key={t.id}>
                <button
                  type="button"
                  disabled={!onPickTest}
                  onClick={() => onPickTest?.(t)}
                  className="flex min-h-11 w-full flex-wrap items-center justify-between gap-2 rounded-md border border-stone-300 bg-white px-2 text-left text-sm hover:bg-stone-50"
                >
                  <span className="font-semibold">{t.label}</span>
                  {t.gainBits !== undefined && <span className="tabular-nums text-stone-700">{t.gainBits.toFixed(2)} bit</span>}
                </button>
              </li>
            ))}
          </ol>
        )}
      </section>
      <section aria-labelledby="ranking-h">
        <h2 id="ranking-h" className="mb-1 text-base font-semibold">
          Probable faulty parts
        </h2>
        {preparing && (
          <div className="mb-2 rounded-md bg-board-light p-2 text-sm" data-testid="preparing-expected">
            <label htmlFor="preparing-progress">
              Preparing expected values: {preparing.partsDone} of {preparing.partsTotal} parts. The ranking works meanwhile, more slowly.
            </label>
            <progress id="preparing-progress" className="mt-1 block w-full" max={Math.max(1, preparing.partsTotal)} value={preparing.partsDone} />
          </div>
        )}
        {!!checkingPairs && (
          <p className="mb-2 text-sm text-stone-700" role="status" data-testid="checking-pairs">
            Still checking {checkingPairs} candidate{checkingPairs === 1 ? '' : 's'} (mostly two faults together): marked parts may still move.
          </p>
        )}
        {before ? (
          <div className="rounded-md bg-board-light p-2 text-sm" data-testid="before-first-reading">
            <p>
              No reading yet.{' '}
              {before.code ? (
                <>
                  Fault code <strong>{before.code}</strong>
                  {before.meaning ? ` (${before.meaning})` : ''} points at: <strong>{before.sections.join(', ') || 'no section in particular'}</strong>.
                </>
              ) : (
                'No fault code was logged.'
              )}{' '}
              {before.firstTest ? (
                <>
                  First test: <strong>{before.firstTest}</strong>
                </>
              ) : (
                'The engine is choosing the first test.'
              )}
            </p>
            {suspectSections.length > 0 && (
              <>
                <p className="mt-1 font-semibold">Where to start</p>
                <ol className="list-inside list-decimal">
                  {suspectSections.map((s) => (
                    <li key={s.name}>
                      {s.name} <span className="tabular-nums">{pct(s.share)}</span>
                    </li>
                  ))}
                </ol>
              </>
            )}
          </div>
        ) : parts.length === 0 ? (
          <p className="text-sm text-stone-700">No part stands out yet: record a reading.</p>
        ) : (
          <ol className="space-y-2">
            {shown.map((p, i) => (
              <li key={`${p.part}-${p.mode}`}>
                <button
                  type="button"
                  onClick={() => onPickPart(p.part)}
                  aria-pressed={selectedPart === p.part}
                  className={`w-full rounded-md border p-2 text-left ${selectedPart === p.part ? 'border-copper bg-amber-50' : 'border-stone-300 bg-white hover:bg-stone-50'}`}
                >
                  <span className="flex items-baseline justify-between gap-2">
                    <span className="font-semibold">
                      {i + 1}. {p.label}
                      {p.checking && <span className="ml-1 text-xs font-normal text-stone-700">(still being checked)</span>}
                    </span>
                    <span className="tabular-nums font-semibold">{pct(p.probability)}</span>
                  </span>
                  <span
                    className="mt-1 block h-2.5 overflow-hidden rounded-full bg-stone-200"
                    role="meter"
                    aria-label={`${p.part} probability`}
                    aria-valuemin={0}
                    aria-valuemax={100}
                    aria-valuenow={Math.round(p.probability * 100)}
                  >
                    <span className="block h-full rounded-full bg-copper" style={{ width: `${Math.max(1, p.probability * 100)}%` }} />
                  </span>
                  {(p.evidenceFor.length > 0 || p.evidenceAgainst.length > 0) && (
                    <span className="mt-1 grid gap-x-3 text-xs sm:grid-cols-2">
                      <span>
                        <span className="font-semibold text-ok">For: </span>
                        {p.evidenceFor.join('; ') || '—'}
                      </span>
                      <span>
                        <span className="font-semibold text-high">Against: </span>
                        {p.evidenceAgainst.join('; ') || '—'}
                      </span>
                    </span>
                  )}
                </button>
              </li>
            ))}
          </ol>
        )}
        {reasons.length > 0 && (
          <details className="mt-2 rounded-md border border-stone-300 bg-white p-2 text-sm" open={Boolean(before)} data-testid="prior-reasons">
            <summary className="cursor-pointer font-semibold">Why these first ({reasons.length})</summary>
            <ul className="mt-1 list-disc space-y-1 pl-5">
              {reasons.map((r) => (
                <li key={r.text}>
                  {r.source === 'fault-code' ? `${r.text} — ${r.parts.join(', ')}` : r.source === 'history-kind' ? `${r.parts.join(', ')}: ${r.text}` : r.text}
                </li>
              ))}
            </ul>
          </details>
        )}
        {!before && parts.length > SHORT_LIST && (
          <button type="button" className="mt-2 min-h-11 rounded-md border border-stone-400 bg-white px-3 text-sm font-semibold" onClick={() => setAll(!all)}>
            {all ? `Show the first ${SHORT_LIST}` : `Show all ${parts.length} candidates`}
          </button>
        )}
      </section>
    </div>
  );
}
