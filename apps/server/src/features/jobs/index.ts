// What other features may use of jobs: they import it from here, never from the files inside.
export { checkMove, moveJob } from './flow';
export type { MoveRequest } from './flow';
export { toReview } from './review-view';
