// What other features may use of references: they import it from here, never from the files inside.
export { measuredPoints } from './service';
