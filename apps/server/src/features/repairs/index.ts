// What other features may use of repairs: they import it from here, never from the files inside.
export { findRepairs } from './service';
