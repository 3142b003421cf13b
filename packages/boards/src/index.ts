// @splitscope/boards — section templates, board composition, demo boards, bench references. Free of the
// circuit engine and mathjs at import time, so the board editor can compose boards in the browser. Unit parsing
// (mathjs) is in '@splitscope/boards/units' and the expected readings (circuit engine) in
// '@splitscope/boards/readings', both loaded only where they are needed.
export * from './references';
export * from './sections/types';
export * from './sections/templates';
export * from './sections/speed';
export * from './sections/bands';
export { ntcResistance } from './sections/sensing';
export { MODELS, SUBCKTS, OPTO_SUBCKT, OPTO_CTR, OPTO_LED_IS, regulatorSubckt } from './sections/library';
export { composeBoard, drawBoard, ComposeError } from './compose/compose';
export type * from './compose/types';
export { renderBoardSvg, pinPosition, connectorPinPosition } from './compose/render';
export { spiceParts, spiceValue } from './compose/spice-section';
export * from './demo';
export { composeCapture, type CaptureMeta, type ComposedCapture } from './compose/capture';
export * from './sections/ports';
