// What other features may use of boards: they import it from here, never from the files inside.
export {
  boardEngine,
  cachedBoardEngine,
  meterOf,
  powerRefusal,
  readBoardModel,
  readStoredBoardModel,
  resolveAlone,
  resolveNet,
  resolveParts,
  verdictFor,
} from './engine';
export { currentBoardVersion, getBoardVersion } from './service';
export { buildBoardEngine, expectedTable, expectedTableFor } from './engine';
export { createBoard, updateBoard } from './service';
export { BUS_CAUTION } from './document-form';
