import { useState } from 'react';
import { FAULT_CODE_WEIGHT, type BoardModel, type FaultCode } from '@splitscope/contract';
import { useBoardFaultCodes, useSaveFaultCode } from '../api/fault-codes';

type Draft = { id: string | null; code: string; title: string; weights: Record<string, string> };
const draftOf = (f: FaultCode): Draft => ({
  id: f.id,
  code: f.code,
  title: f.title,
  weights: Object.fromEntries(f.sections.map((s) => [s, String(f.weights[s] ?? FAULT_CODE_WEIGHT)])),
});

/**
 * The shop's fault-code table for this board: code → what it means → the sections it points at, each with how
 * strongly (× on the odds of a fault there: 1 = no steer). At intake the code raises the priors of those sections'
 * parts, so the bench's first tests start there.
 */
export function FaultCodesPanel({ boardId, doc, canEdit }: { boardId: string; doc: BoardModel; canEdit: boolean }) {
  const codes = useBoardFaultCodes(boardId);
  const save = useSaveFaultCode(boardId);
  const [draft, setDraft] = useState<Draft | null>(null);
  const title = (id: string) => doc.sections.find((s) => s.id === id)?.title ?? id;

  const submit = () => {
    if (!draft) return;
    const sections = Object.keys(draft.weights);
    const weights = Object.fromEntries(sections.map((s) => [s, Number(draft.weights[s])]));
    save.mutate({ id: draft.id, input: { code: draft.code, title: draft.title, sections, weights } }, { onSuccess: () => setDraft(null) });
  };

  return (
    <section aria-labelledby="codes-h" className="space-y-2">
      <h2 id="codes-h" className="text-lg font-semibold">
        Fault codes
      </h2>
      <p className="text-sm text-stone-700">
        A code the unit shows makes a fault in its sections likelier: ×{FAULT_CODE_WEIGHT} unless a weight says otherwise.
      </p>
      <ul className="space-y-1 text-sm">
        {codes.data?.items.map((f) => (
          <li key={f.id} className="rounded-md border border-stone-300 bg-white p-2">
            <strong>{f.code}</strong> — {f.title}: {f.sections.map((s) => `${title(s)} ×${f.weights[s] ?? FAULT_CODE_WEIGHT}`).join(', ') || 'no section'}
            {canEdit && (
              <button type="button" className="ml-2 min-h-11 rounded-md border border-stone-400 px-3" onClick={() => setDraft(draftOf(f))}>
                Edit {f.code}
              </button>
            )}
          </li>
        ))}
      </ul>
      {canEdit && !draft && (
        <button
          type="button"
          className="min-h-11 rounded-md border border-stone-400 bg-white px-3 text-sm font-semibold"
          onClick={() => setDraft({ id: null, code: '', title: '', weights: {} })}
        >
          Add a fault code
        </button>
      )}
      {draft && (
        <fieldset className="rounded-md border border-stone-400 bg-white p-2 text-sm">
          <legend className="font-semibold">{draft.id ? `Edit ${draft.code}` : 'New fault code'}</legend>
          <label className="block">
            Code{' '}
            <input
              className="ml-1 min-h-11 w-24 rounded-md border border-stone-500 px-2"
              value={draft.code}
              onChange={(e) => setDraft({ ...draft, code: e.target.value })}
            />
          </label>
          <label className="mt-1 block">
            What it means{' '}
            <input
              className="ml-1 min-h-11 w-full rounded-md border border-stone-500 px-2"
              value={draft.title}
              onChange={(e) => setDraft({ ...draft, title: e.target.value })}
            />
          </label>
          <p className="mt-2 font-medium">Suspect sections and weights</p>
          <div className="grid gap-1 sm:grid-cols-2">
            {doc.sections.map((s) => {
              const on = s.id in draft.weights;
              return (
                <span key={s.id} className="flex items-center gap-2">
                  <label className="flex min-h-11 flex-1 items-center gap-2">
                    <input
                      type="checkbox"
                      checked={on}
                      onChange={() => {
                        const w = { ...draft.weights };
                        if (on) delete w[s.id];
                        else w[s.id] = String(FAULT_CODE_WEIGHT);
                        setDraft({ ...draft, weights: w });
                      }}
                    />
                    {s.title}
                  </label>
                  {on && (
                    <input
                      aria-label={`Weight of ${s.title}`}
                      inputMode="decimal"
                      className="min-h-11 w-16 rounded-md border border-stone-500 px-2"
                      value={draft.weights[s.id]}
                      onChange={(e) => setDraft({ ...draft, weights: { ...draft.weights, [s.id]: e.target.value } })}
                    />
                  )}
                </span>
              );
            })}
          </div>
          {save.isError && (
            <p role="alert" className="mt-1 text-high">
              {save.error.message}
            </p>
          )}
          <div className="mt-2 flex gap-2">
            <button type="button" disabled={save.isPending} onClick={submit} className="min-h-11 rounded-md bg-board px-4 font-semibold text-white">
              Save the code
            </button>
            <button type="button" onClick={() => setDraft(null)} className="min-h-11 rounded-md border border-stone-400 px-3">
              Cancel
            </button>
          </div>
        </fieldset>
      )}
    </section>
  );
}
