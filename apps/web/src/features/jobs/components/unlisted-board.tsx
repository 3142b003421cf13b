import { useState } from 'react';
import { openUnlistedBoard } from '../api/create-unlisted-board';

/** The board select's value for a board the library does not hold yet. */
export const UNLISTED = 'unlisted-board';

const field = 'mt-1 block min-h-11 w-full rounded-md border border-stone-500 bg-white px-3';

/**
 * Intake of a board not in the library: its maker and model as printed on it, and the photos (the first one
 * becomes the board's picture). The board is put in the library before the job opens on it.
 */
export function useUnlistedBoard(active: boolean) {
  const [maker, setMaker] = useState('');
  const [model, setModel] = useState('');
  const [error, setError] = useState<string | null>(null);
  /** The board id to open the job on: the chosen one, or the new board made from the fields and the first photo. */
  const boardIdFor = async (chosen: string, photos: File[]): Promise<string | null> => {
    if (!active) return chosen;
    setError(null);
    if (!maker.trim() || !model.trim()) return (setError('Type the maker and the model as printed on the board.'), null);
    const photo = photos[0];
    if (!photo) return (setError('Add a photo of the board: it becomes the picture its test points are placed on.'), null);
    try {
      return await openUnlistedBoard(maker.trim(), model.trim(), photo);
    } catch (err) {
      setError(`The board could not be put in the library: ${(err as Error).message}`);
      return null;
    }
  };
  return { active, maker, setMaker, model, setModel, error, boardIdFor };
}

export function UnlistedBoardFields({ state }: { state: ReturnType<typeof useUnlistedBoard> }) {
  if (!state.active) return null;
  return (
    <fieldset className="grid gap-4 rounded-md border border-stone-300 p-3 sm:col-span-2 sm:grid-cols-2">
      <legend className="px-1 text-sm font-semibold">Board not in the library yet</legend>
      <p className="text-sm text-stone-800 sm:col-span-2">
        The job opens on the board's photo. Until someone marks its sections and publishes a model, readings on it are recorded, not judged.
      </p>
      <label className="block">
        <span className="text-sm font-medium">Maker (as printed on the board)</span>
        <input className={field} value={state.maker} onChange={(e) => state.setMaker(e.target.value)} />
      </label>
      <label className="block">
        <span className="text-sm font-medium">Model (as printed on the board)</span>
        <input className={field} value={state.model} onChange={(e) => state.setModel(e.target.value)} />
      </label>
    </fieldset>
  );
}
