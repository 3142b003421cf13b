// What other features may use of diagnosis: they import it from here, never from the files inside.
export { computeDiagnosis, toSnapshot } from './service';
export { ensureDictionary } from './dictionary';
