// '@splitscope/boards/readings' — the expected-readings table, computed by the circuit engine. A sub-path of its
// own so the package index (templates, composeBoard) stays free of the circuit engine and mathjs.
export { expectedReadings, defaultBand } from './expected';
export type { ExpectedReading, ExpectedReadingsInput, ExpectedReadingsTestPoint, ExpectedReadingsOptions, BandFn } from './expected';
export { parallelNote, parallelOf, resistorsByNets } from './parallel';
