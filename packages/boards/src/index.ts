// @splitscope/boards — section templates, board references. Unit parsing (mathjs) lives in './units' and is
// deliberately not re-exported here, so the web app can lazy-import it.
export * from './references';
export * from './sections/types';
export * from './sections/templates';
export { MODELS, SUBCKTS, OPTO_SUBCKT, OPTO_CTR, OPTO_LED_IS, regulatorSubckt } from './sections/library';
export * from './demo/outdoor-fan';
