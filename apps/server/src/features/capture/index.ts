// What other features may use of capture: they import it from here, never from the files inside.
export { capturedPointIds } from './service';
