import type { StoredReading } from '@splitscope/contract';
import { useState, type FormEvent } from 'react';
import { useStrikeReading } from '@/lib/api/strike-reading';
import { formSubmit } from '@/lib/form-submit';

/**
 * Correct (enter the value again: the old reading stays, struck through, with who and when) or strike out with a
 * reason. Both append: nothing stored is changed.
 */
export function ReadingActions({
  reading,
  jobId,
  onCorrect,
}: {
  reading: StoredReading;
  jobId: string;
  onCorrect: (r: StoredReading, text: string) => Promise<string | null>;
}) {
  const [mode, setMode] = useState<'idle' | 'correct' | 'strike'>('idle');
  const [text, setText] = useState('');
  const [error, setError] = useState<string | null>(null);
  const strike = useStrikeReading(jobId);
  if (reading.supersededBy || reading.struck) return null;
  const submit = async (e: FormEvent) => {
    e.preventDefault();
    if (mode === 'correct') {
      const err = await onCorrect(reading, text);
      setError(err);
      if (!err) setMode('idle');
    } else {
      try {
        await strike.mutateAsync({ readingId: reading.id, reason: text });
        setMode('idle');
      } catch (err) {
        setError((err as Error).message);
      }
    }
  };
  if (mode === 'idle')
    return (
      <span className="flex gap-1">
        <button
          type="button"
          className="min-h-11 rounded border border-stone-400 bg-white px-2 text-xs font-semibold"
          onClick={() => (setText(''), setError(null), setMode('correct'))}
        >
          Correct
        </button>
        <button
          type="button"
          className="min-h-11 rounded border border-stone-400 bg-white px-2 text-xs font-semibold"
          onClick={() => (setText(''), setError(null), setMode('strike'))}
        >
          Strike
        </button>
      </span>
    );
  return (
    <form onSubmit={formSubmit(submit)} className="flex flex-wrap gap-1">
      <input
        aria-label={mode === 'correct' ? 'Corrected value' : 'Why strike this reading'}
        value={text}
        onChange={(e) => setText(e.target.value)}
        placeholder={mode === 'correct' ? 'value as read' : 'reason'}
        className="min-h-11 w-28 rounded border border-stone-500 px-2 text-sm"
        autoFocus
      />
      <button type="submit" className="min-h-11 rounded bg-board px-2 text-xs font-semibold text-white">
        {mode === 'correct' ? 'Save correction' : 'Strike out'}
      </button>
      <button type="button" className="min-h-11 px-1 text-xs underline" onClick={() => setMode('idle')}>
        Cancel
      </button>
      {error && (
        <span role="alert" className="w-full text-xs text-high">
          {error}
        </span>
      )}
    </form>
  );
}
