// What other features may use of boards: they import it from here, never from the files inside.
export { boardEngine, cachedBoardEngine, meterOf, meterOptions, normNet, powerRefusal, readBoardModel, resolveNet, resolveParts, unitOf, verdictFor } from './engine';
export { getBoardVersion } from './service';
