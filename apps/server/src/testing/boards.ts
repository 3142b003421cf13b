// Invented board models shared by the integration tests (through factories.ts) and the browser specs
// (tests/e2e/support), which send them through the API. Pure values only, so a browser spec can import this
// file without loading the server.
import { BOARD_MODEL_SCHEMA_VERSION, boardModelSchema, type BoardModel } from '@splitscope/contract';

/** A small invented board: a 15 V rail through a 10k/10k divider, two test points. */
export const DIVIDER_BOARD: BoardModel = boardModelSchema.parse({
  schemaVersion: BOARD_MODEL_SCHEMA_VERSION,
  id: 'test-divider',
  slug: 'test-divider',
  name: 'Test divider board',
  family: 'Tests',
  maker: 'Invented',
  picture: { width: 400, height: 300, units: 'px' },
  netlist: '* invented test board\nVS in 0 DC 15\nR1 in mid 10k\nR2 mid 0 10k\n.end\n',
  parts: [
    {
      designator: 'R1',
      element: 'R1',
      kind: 'resistor',
      value: '10k',
      package: '0805',
      x: 100,
      y: 100,
      section: 'div',
      pins: [
        { pin: '1', net: 'in' },
        { pin: '2', net: 'mid' },
      ],
    },
    {
      designator: 'R2',
      element: 'R2',
      kind: 'resistor',
      value: '10k',
      package: '0805',
      x: 200,
      y: 100,
      section: 'div',
      pins: [
        { pin: '1', net: 'mid' },
        { pin: '2', net: '0' },
      ],
    },
  ],
  nets: [
    { name: 'in', label: '15 V rail', side: 'hot', reference: '0' },
    { name: 'mid', label: 'divider', side: 'hot', reference: '0' },
  ],
  testPoints: [
    { id: 'TP1', net: 'in', label: '15 V rail', reference: '0', x: 80, y: 150, powerStates: ['on'], modes: ['dcv'], section: 'div', touchesBus: false },
    { id: 'TP2', net: 'mid', label: 'divider', reference: '0', x: 180, y: 150, powerStates: ['on'], modes: ['dcv'], section: 'div', touchesBus: false },
  ],
  faultCodes: [{ code: 'T1', meaning: 'Rail missing (invented)', suspectSections: [] }],
});
