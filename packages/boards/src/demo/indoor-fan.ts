// The indoor fan-drive demo board: invented ("Fjordline IDF-310"), composed from the shared section templates —
// a DC bus for the motor's power stage, the 15 V and 5 V regulators, the opto-driven fan supply switch, the
// speed command, the speed feedback and two thermistor inputs (room and indoor coil).
import type { BoardModel } from '@splitscope/contract';
import { composeBoard } from '../compose/compose';
import type { BoardSpec, TemplateSectionInstance } from '../compose/types';

/** The room and coil inputs are one thermistor-sense section each, side by side along the bottom edge. */
const thermistorInput = (id: string, base: number, title: string, sensor: string, celsius: number, x: number): TemplateSectionInstance => ({
  id,
  template: 'thermistor-sense',
  base,
  title,
  nets: { sensor },
  params: { celsius },
  region: { x, y: 630, w: 360, h: 130 },
});

export const INDOOR_FAN_SPEC: BoardSpec = {
  id: 'demo-idf-310',
  slug: 'fjordline-idf-310',
  name: 'Fjordline IDF-310 indoor fan drive',
  family: 'Fjordline IDF indoor boards',
  maker: 'Fjordline (invented demo maker)',
  description:
    'Invented demo board: indoor unit controller with a DC fan motor drive (bus, 15 V supply switched by an opto-driven PNP, ' +
    'opto-isolated speed command and feedback), a 5 V controller supply on the cold side and room/coil thermistor inputs.',
  width: 1200,
  height: 920,
  colours: { mask: '#1d3f5e', silk: '#eef3f7', copper: '#c8924a' },
  silkTitle: 'FJORDLINE IDF-310 rev A (demo)',
  coldGround: 'gnd_c',
  params: { FAN_ON: 1, DUTY: 0.6, FG_LOW: 1 },
  sections: [
    {
      id: 'bus',
      template: 'dc-bus',
      base: 100,
      nets: { bus: 'vbus', hotGnd: '0' },
      params: { mainsRms: 230, bulkF: 100e-6 },
      region: { x: 40, y: 60, w: 380, h: 250 },
    },
    { id: 'reg15', template: 'regulator-15v', base: 200, nets: { out: 'v15', gnd: '0' }, region: { x: 440, y: 60, w: 330, h: 250 } },
    { id: 'reg5', template: 'regulator-5v', base: 250, nets: { out: 'vcc5_c', gnd: 'gnd_c' }, region: { x: 790, y: 60, w: 370, h: 250 } },
    {
      id: 'fan-switch',
      template: 'fan-switch',
      base: 300,
      nets: { in: 'v15', out: 'v15sw', coldVcc: 'vcc5_c', coldGnd: 'gnd_c' },
      region: { x: 40, y: 340, w: 440, h: 260 },
    },
    { id: 'speed-cmd', template: 'speed-command', base: 400, nets: { supply: 'v15sw', out: 'vsp' }, region: { x: 500, y: 340, w: 360, h: 260 } },
    {
      id: 'speed-fb',
      template: 'speed-feedback',
      base: 500,
      nets: { supply: 'v15sw', fg: 'fg', coldVcc: 'vcc5_c' },
      params: { pulsesPerRevolution: 4 },
      region: { x: 880, y: 340, w: 280, h: 260 },
    },
    thermistorInput('room-th', 600, 'Room thermistor input', 'room_th', 25, 40),
    thermistorInput('coil-th', 610, 'Coil thermistor input', 'coil_th', 10, 420),
  ],
  connectors: [
    {
      name: 'CN1',
      x: 820,
      y: 650,
      title: 'Mains in',
      pins: [
        { pin: 'L', net: 'bus_acl', function: 'Line' },
        { pin: 'N', net: 'bus_acn', function: 'Neutral' },
      ],
    },
    {
      name: 'CN2',
      x: 960,
      y: 650,
      title: 'Sensors',
      pins: [
        { pin: '1', net: 'room_th', function: 'Room NTC' },
        { pin: '2', net: 'gnd_c', function: 'Ground (cold)' },
        { pin: '3', net: 'coil_th', function: 'Coil NTC' },
        { pin: '4', net: 'gnd_c', function: 'Ground (cold)' },
      ],
    },
    {
      name: 'CN5',
      x: 40,
      y: 790,
      title: 'Fan motor',
      pins: [
        { pin: '1', net: 'vbus', function: 'Motor supply (bus +)' },
        { pin: '2', net: '0', function: 'Bus −' },
        { pin: '3', net: 'v15sw', function: '15 V control supply' },
        { pin: '4', net: 'vsp', function: 'Speed command' },
        { pin: '5', net: 'fg', function: 'Speed pulses (FG)' },
      ],
    },
  ],
  faultCodes: [
    {
      code: 'E1',
      meaning: 'Indoor fan motor: no speed pulses within 30 s of the start command (invented code)',
      suspectSections: ['fan-switch', 'speed-fb', 'speed-cmd'],
      weights: { 'fan-switch': 8, 'speed-fb': 3, 'speed-cmd': 3 },
    },
    { code: 'E2', meaning: 'Room thermistor open or shorted (invented code)', suspectSections: ['room-th'] },
    { code: 'E3', meaning: 'Indoor coil thermistor open or shorted (invented code)', suspectSections: ['coil-th'] },
    { code: 'E5', meaning: 'Indoor fan speed does not follow the command (invented code)', suspectSections: ['speed-cmd', 'speed-fb'] },
    { code: 'E8', meaning: 'Controller or motor control supply low (invented code)', suspectSections: ['reg15', 'reg5'], weights: { reg15: 8, reg5: 4 } },
  ],
  motor: {
    connector: 'CN5',
    pulsesPerRevolution: 4,
    elements: ['VMFG501', 'RMFG501', 'QMFG501'],
    note: 'Invented 8-pole demo motor: FG toggles once per electrical cycle, 4 pulses per revolution',
  },
  cautions: [
    'Mains and the ~300 V DC bus feeding the fan motor can kill. Unplug the board and measure the bus below the safe threshold before any unpowered test; follow local codes and licensed practice.',
    'The hot side (bus negative) is not isolated from mains: never clip a mains-earthed instrument to it.',
  ],
};

/** The indoor fan-drive demo board document (validated against the contract's board-model schema). */
export const INDOOR_FAN_BOARD: BoardModel = composeBoard(INDOOR_FAN_SPEC);
