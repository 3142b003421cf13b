// What other features may use of reviews: they import it from here, never from the files inside.
export { toReview } from './view';
