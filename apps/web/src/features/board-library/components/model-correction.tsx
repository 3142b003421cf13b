import { boardModelSchema, hasRole, ROLES, type BoardDetail } from '@splitscope/contract';
import { useState } from 'react';
import { useMe } from '@/lib/api/me';
import { useCorrectVersion } from '../api/correct-version';

/**
 * A version whose stored model the schema rejects: what is wrong, in the schema's words, and for a lead the stored
 * model to correct and store in place of it. Jobs on the version record readings without judging them until then.
 */
export function ModelCorrection({ board }: { board: BoardDetail & { modelProblem: NonNullable<BoardDetail['modelProblem']> } }) {
  const me = useMe();
  const canFix = hasRole(me.data?.role, ROLES.reviewers);
  const correct = useCorrectVersion(board.versionId);
  const [text, setText] = useState(() => JSON.stringify(board.modelProblem.stored, null, 2));
  const [error, setError] = useState<string | null>(null);

  // Checked here with the contract's schema first, so the lead sees the next field at fault without a round trip.
  const submit = () => {
    setError(null);
    let json: unknown;
    try {
      json = JSON.parse(text);
    } catch (err) {
      return setError(`The model is not valid JSON: ${(err as Error).message}`);
    }
    const parsed = boardModelSchema.safeParse(json);
    if (!parsed.success) {
      const issue = parsed.error.issues[0]!;
      return setError(`Still not readable: ${issue.path.join('.') || 'the model'}: ${issue.message}`);
    }
    correct.mutate({ document: parsed.data }, { onError: (e) => setError(e.message) });
  };

  return (
    <div className="space-y-3">
      <h1 className="text-2xl font-semibold">
        {board.name} · version {board.version}
      </h1>
      <div role="alert" className="rounded-md border border-amber-600 bg-amber-50 p-3">
        <p className="font-semibold">This version's model needs upgrading by a lead before readings can be judged.</p>
        <p className="text-sm">
          The stored model does not match the board-model form:{' '}
          {board.modelProblem.message.replace(/^The board model does not match the board-model schema: /, '')}.
        </p>
        <p className="text-sm">
          Jobs on this version open on the photo and its test points; their readings are recorded, not judged, until the corrected model is stored.
        </p>
      </div>
      {canFix ? (
        <section aria-labelledby="fix-h" className="space-y-2">
          <h2 id="fix-h" className="text-lg font-semibold">
            Correct the stored model
          </h2>
          <p className="text-sm text-stone-700">
            Edit the field named above and store the corrected model in place of version {board.version}. Jobs keep this version and their readings.
          </p>
          <textarea
            aria-label="Stored model"
            value={text}
            onChange={(e) => setText(e.target.value)}
            rows={16}
            spellCheck={false}
            className="block w-full rounded-md border border-stone-500 bg-white p-2 font-mono text-xs"
          />
          {error && (
            <p role="alert" className="rounded-md bg-red-50 p-2 text-sm text-high">
              {error}
            </p>
          )}
          <button type="button" onClick={submit} disabled={correct.isPending} className="min-h-11 rounded-md bg-board px-4 font-semibold text-white">
            {correct.isPending ? 'Storing…' : `Store the corrected model as version ${board.version}`}
          </button>
        </section>
      ) : (
        <p className="text-sm">Ask a lead to correct it.</p>
      )}
    </div>
  );
}
