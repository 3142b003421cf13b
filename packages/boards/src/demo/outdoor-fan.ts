// The outdoor fan-drive demo board: an invented maker ("Fjordline") and an invented board, composed from its
// sections written as plain SPICE. Test-point ids and nets are stable: the demo jobs, the browser tests and the
// diagnosis tests refer to them.
import type { BoardModel } from '@splitscope/contract';
import { composeBoard } from '../compose/compose';
import type { BoardSpec } from '../compose/types';
import { busBand, RAIL_15V, SPEED_COMMAND, SWITCHED_15V } from '../sections/bands';
import type { TestPointSuggestion } from '../sections/types';
import { OUTDOOR_BUS, OUTDOOR_FAN_SWITCH, OUTDOOR_FEEDBACK, OUTDOOR_HEADER, OUTDOOR_LOGIC, OUTDOOR_SPEED_COMMAND, OUTDOOR_SUPPLIES } from './outdoor-sections';

const powered = (net: string, label: string, band: TestPointSuggestion['band']): TestPointSuggestion => ({
  label,
  net,
  reference: '0',
  powerStates: ['on', 'off'],
  modes: ['dcv', 'ohm', 'diode', 'continuity'],
  ...(band ? { band } : {}),
});

export const OUTDOOR_FAN_SPEC: BoardSpec = {
  id: 'demo-ofd-220',
  slug: 'fjordline-ofd-220',
  name: 'Fjordline OFD-220 outdoor fan drive',
  family: 'Fjordline OFD outdoor boards',
  maker: 'Fjordline (invented demo maker)',
  description: 'Invented demo board: DC bus, 15 V regulator, opto-driven PNP fan-supply switch, speed command and feedback.',
  width: 1200,
  height: 930,
  silkTitle: 'FJORDLINE OFD-220 rev B (demo)',
  header: OUTDOOR_HEADER,
  params: { FAN_ON: 1, SPEED: 0.6 },
  // Section order is the netlist's element order, which the diagnosis tests are tuned to.
  sections: [
    {
      id: 'bus',
      title: 'DC bus',
      spice: OUTDOOR_BUS,
      side: 'hot',
      touchesBus: true,
      region: { x: 40, y: 60, w: 340, h: 300 },
      testPoints: [powered('bus', 'DC bus +', busBand(220, 0.1))],
    },
    {
      id: 'reg15',
      title: '15 V regulator',
      spice: OUTDOOR_SUPPLIES,
      side: 'hot',
      touchesBus: false,
      region: { x: 420, y: 60, w: 340, h: 300 },
      kinds: { XVREG: 'regulator' },
      testPoints: [powered('v15', '15 V rail', RAIL_15V)],
    },
    {
      id: 'fan-switch',
      title: 'Fan supply switch',
      spice: OUTDOOR_FAN_SWITCH,
      side: 'hot',
      touchesBus: false,
      region: { x: 800, y: 60, w: 360, h: 300 },
      offBoard: ['RLOAD'],
      testPoints: [powered('vfan', 'Fan control supply (VFAN)', SWITCHED_15V)],
    },
    { id: 'feedback', title: 'Speed feedback', spice: OUTDOOR_FEEDBACK, side: 'hot', touchesBus: false, region: { x: 460, y: 420, w: 320, h: 320 } },
    {
      id: 'speed-cmd',
      title: 'Speed command',
      spice: OUTDOOR_SPEED_COMMAND,
      side: 'hot',
      touchesBus: false,
      region: { x: 40, y: 420, w: 380, h: 320 },
      testPoints: [powered('vsp', 'Speed command (VSP)', SPEED_COMMAND)],
    },
    { id: 'logic', title: 'Controller I/O', spice: OUTDOOR_LOGIC, side: 'hot', touchesBus: false, region: { x: 820, y: 420, w: 340, h: 340 } },
  ],
  testPoints: [
    { id: 'TP1', net: 'bus', label: 'DC bus +', section: 'bus', near: 'C1' },
    { id: 'TP2', net: 'aux1', label: 'Regulator input', section: 'reg15', near: 'C3' },
    { id: 'TP3', net: 'v15', label: '15 V rail', section: 'reg15', near: 'C5' },
    { id: 'TP4', net: 'v5', label: '5 V logic', section: 'reg15', near: 'C7' },
    { id: 'TP5', net: 'vfan', label: 'Fan control supply (VFAN)', section: 'fan-switch', near: 'C8' },
    { id: 'TP6', net: 'b1', label: 'Switch base', section: 'fan-switch', near: 'R7' },
    { id: 'TP7', net: 'oc', label: 'Drive opto collector', section: 'fan-switch', near: 'XU1' },
    { id: 'TP8', net: 'la', label: 'Drive opto LED anode', section: 'fan-switch', near: 'R6' },
    { id: 'TP9', net: 'vsp', label: 'Speed command (VSP)', section: 'speed-cmd', near: 'C12' },
    { id: 'TP10', net: 'fbc', label: 'Feedback opto output', section: 'feedback', near: 'R14' },
    { id: 'TP11', net: 'th1', label: 'Thermistor divider', section: 'logic', near: 'RTH1' },
    { id: 'TP12', net: 'rl', label: 'Relay driver collector', section: 'logic', near: 'Q4' },
  ],
  connectors: [
    {
      name: 'CN1',
      x: 60,
      y: 800,
      title: 'DC bus in',
      pins: [
        { pin: '1', net: 'bus', function: 'Bus +' },
        { pin: '2', net: '0', function: 'Bus −' },
      ],
    },
    {
      name: 'CN3',
      x: 1040,
      y: 800,
      title: 'Fan motor',
      pins: [
        { pin: '1', net: 'vfan', function: '15 V control supply' },
        { pin: '2', net: 'vsp', function: 'Speed command' },
        { pin: '3', net: 'fgk', function: 'Speed pulses' },
        { pin: '4', net: '0', function: 'Ground' },
      ],
    },
  ],
  faultCodes: [
    {
      code: 'F7',
      meaning: 'Outdoor fan motor: no speed feedback after start command (invented code)',
      suspectSections: ['fan-switch', 'feedback', 'speed-cmd'],
      weights: { 'fan-switch': 8, feedback: 3, 'speed-cmd': 3 },
    },
    { code: 'F3', meaning: 'DC bus voltage out of range (invented code)', suspectSections: ['bus'], weights: { bus: 10 } },
    { code: 'F9', meaning: 'Outdoor coil thermistor open or shorted (invented code)', suspectSections: ['logic'] },
  ],
  motor: { connector: 'CN3', pulsesPerRevolution: 4, elements: ['RLOAD', 'R13'], note: 'Pulses per revolution of the invented demo motor' },
  cautions: [
    'Mains and the ~300 V DC bus can kill. Unplug the board and measure the bus below the safe threshold before any unpowered test; follow local codes and licensed practice.',
  ],
};

/** The outdoor fan-drive demo board document (validated against the contract's board-model schema). */
export const OUTDOOR_FAN_BOARD: BoardModel = composeBoard(OUTDOOR_FAN_SPEC);
