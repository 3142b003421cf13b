// What other features may use of parts-bin: they import it from here, never from the files inside.
export { checkBinTake, takeFromBin } from './service';
export { partsBinRoutes } from './routes';
