// A counter of this process's writes to what a job's priors are made of (fault codes, repairs, verified or
// returned jobs, reference boards). The diagnosis keeps each job's priors until the readings or this counter
// change (features/diagnosis/priors-cache.ts); the writers bump it. It lives below the features so that none of
// them imports the diagnosis feature for it. Writes made by another server process reach this one's kept priors
// after the cache's time limit.
let generation = 0;

export const priorsGeneration = (): number => generation;

export function priorsChanged(): void {
  generation++;
}
