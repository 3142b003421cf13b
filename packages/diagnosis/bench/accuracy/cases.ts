// The bench's fault cases: a board section, the faults injected into it, the symptom the board came in with and
// the first readings a technician takes for that symptom. `accept` lists the engine's fault-mode names that mean
// the injected fault (matched as a regular expression on the mode, the part must be the same).
import type { BenchBoard } from './board';
import { B01_BUS, B02_REG15, B03_REG5, B09_ZENER, B10_SHUNT, B11_BOOTSTRAP } from './boards-power';
import { B12_FAN_DRIVE } from './boards-fan';
import { B04_FAN_SWITCH, B05_SPEED_CMD, B06_FEEDBACK, B07_THERMISTOR, B08_RELAY } from './boards-signal';
import type { FaultSpec, Injection } from './deck';
import type { Probe } from './meter';

export interface TrueFault extends FaultSpec {
  words: string;
  accept: RegExp;
}

export interface BenchCase {
  id: string;
  board: BenchBoard;
  params?: Record<string, number>;
  symptom: string;
  faults: TrueFault[];
  start: Probe[];
  /** Why the case is hard, for the table's reader. */
  note?: string;
}

const fault = (part: string, injection: Injection, words: string, accept: RegExp): TrueFault => ({ part, injection, words, accept });
const short = (part: string, ohms: number, what = 'short') => fault(part, { do: 'short', ohms }, `${part} ${what}`, /^short$/);
const open = (part: string) => fault(part, { do: 'open' }, `${part} open`, /^open$/);
const drift = (part: string, factor: number) => fault(part, { do: 'scale', factor }, `${part} drifted ×${factor}`, /^drift/);
const ceShort = (part: string) => fault(part, { do: 'ce-short', ohms: 1 }, `${part} collector–emitter short`, /^ce-short$/);
const beOpen = (part: string) => fault(part, { do: 'be-open' }, `${part} base–emitter open`, /^be-open$/);
const ledOpen = (part: string) => fault(part, { do: 'inner', element: 'DLED', inner: { do: 'open' } }, `${part} opto — LED open`, /^dled:open$/);
const dcv = (red: string, black = '0'): Probe => ({ mode: 'dcv', red, black, power: 'on' });
const beep = (red: string, black = '0'): Probe => ({ mode: 'continuity', red, black, power: 'off' });

export const CASES: BenchCase[] = [
  {
    id: 'B01-bulk-open',
    board: B01_BUS,
    symptom: 'F3 bus voltage out of range',
    start: [dcv('bus')],
    // Model: with C101 open the bus is the unsmoothed full-wave rectified mains; a DC meter reads its mean
    // (2√2/π·Vrms less the bridge drops), which the transient ground truth computes directly.
    faults: [fault('C101', { do: 'open' }, 'C101 bulk capacitor open (dried out)', /open|dry|dried|capacit/)],
    note: 'not in the DC model: the honest answer is "not explained"',
  },
  { id: 'B01-sense-drift', board: B01_BUS, symptom: 'F3 bus voltage out of range', start: [dcv('bs')], faults: [drift('R103', 2.5)] },
  {
    id: 'B01-bridge-short',
    board: B01_BUS,
    symptom: 'mains fuse blown, board dead',
    start: [beep('n', '0')],
    faults: [short('D104', 0.5)],
    note: 'starts unpowered; a powered test on it is a hazard',
  },
  { id: 'B02-zener-short', board: B02_REG15, symptom: 'no 15 V, board dead', start: [dcv('v15')], faults: [short('DZ201', 0.3)] },
  { id: 'B02-pass-be-open', board: B02_REG15, symptom: 'no 15 V, board dead', start: [dcv('v15')], faults: [beOpen('Q201')] },
  { id: 'B02-cap-short', board: B02_REG15, symptom: 'no 15 V, board dead', start: [dcv('v15')], faults: [short('C203', 0.2)] },
  {
    id: 'B03-reg-dead',
    board: B03_REG5,
    symptom: 'controller dead, no 5 V',
    start: [dcv('v5')],
    faults: [fault('XU301', { do: 'inner', element: 'QPASS', inner: { do: 'open' } }, 'XU301 regulator dead (no output)', /^dead$/)],
  },
  { id: 'B03-cap-short', board: B03_REG5, symptom: 'controller dead, no 5 V', start: [dcv('v5')], faults: [short('C302', 0.2)] },
  { id: 'B04-led-open', board: B04_FAN_SWITCH, symptom: 'outdoor fan never starts', start: [dcv('vf')], faults: [ledOpen('XU401')] },
  { id: 'B04-switch-be-open', board: B04_FAN_SWITCH, symptom: 'outdoor fan never starts', start: [dcv('vf')], faults: [beOpen('Q401')] },
  { id: 'B04-drive-r-open', board: B04_FAN_SWITCH, symptom: 'outdoor fan never starts', start: [dcv('vf')], faults: [open('R402')] },
  {
    id: 'B04-cap+ce-short',
    board: B04_FAN_SWITCH,
    symptom: 'outdoor fan never starts, 15 V rail low',
    start: [dcv('vf'), dcv('v15')],
    faults: [short('C401', 0.2), ceShort('Q401')],
    note: 'masked pair: the C–E short shows nothing alone with the fan on',
  },
  {
    id: 'B04-ce-short+led-open',
    board: B04_FAN_SWITCH,
    params: { FANON: 0 },
    symptom: 'fan runs when the controller stops it',
    start: [dcv('vf')],
    faults: [ceShort('Q401'), ledOpen('XU401')],
    note: 'masked pair: the LED open is invisible while Q401 conducts; only an unpowered test of the LED shows it',
  },
  { id: 'B05-led-open', board: B05_SPEED_CMD, symptom: 'fan always at full speed', start: [dcv('vsp')], faults: [ledOpen('XU501')] },
  { id: 'B05-pullup-open', board: B05_SPEED_CMD, symptom: 'fan never starts (speed command 0)', start: [dcv('vsp')], faults: [open('R502')] },
  {
    id: 'B05-ctr-low',
    board: B05_SPEED_CMD,
    symptom: 'fan runs faster than commanded',
    start: [dcv('vsp')],
    faults: [fault('XU501', { do: 'inner', element: 'FCT', inner: { do: 'scale', factor: 0.35 } }, 'XU501 opto — CTR degraded to 35 %', /^fct:drift/)],
  },
  { id: 'B05-follower-ce-short', board: B05_SPEED_CMD, symptom: 'fan always at full speed', start: [dcv('vsp')], faults: [ceShort('Q501')] },
  { id: 'B06-led-r-open', board: B06_FEEDBACK, symptom: 'F7 no speed feedback', start: [dcv('fo', 'gc')], faults: [open('R601')] },
  { id: 'B06-clamp-short', board: B06_FEEDBACK, symptom: 'F7 no speed feedback', start: [dcv('fin', 'gc')], faults: [short('D601', 0.5)] },
  { id: 'B07-sensor-open', board: B07_THERMISTOR, symptom: 'F9 coil sensor out of range', start: [dcv('th')], faults: [open('RTH701')] },
  { id: 'B07-filter-short', board: B07_THERMISTOR, symptom: 'F9 coil sensor out of range', start: [dcv('adc')], faults: [short('C701', 0.3)] },
  { id: 'B07-pullup-drift', board: B07_THERMISTOR, symptom: 'coil temperature reads wrong', start: [dcv('th')], faults: [drift('R701', 2.2)] },
  { id: 'B08-be-open', board: B08_RELAY, symptom: 'relay never clicks', start: [dcv('rc')], faults: [beOpen('Q801')] },
  { id: 'B08-flyback-short', board: B08_RELAY, symptom: 'relay never clicks', start: [dcv('rc')], faults: [short('D801', 0.5)] },
  { id: 'B08-base-r-open', board: B08_RELAY, symptom: 'relay never clicks', start: [dcv('rc')], faults: [open('R801')] },
  {
    id: 'B08-ce-short+base-open',
    board: B08_RELAY,
    params: { RLY: 0 },
    symptom: 'relay stays on when switched off',
    start: [dcv('rc')],
    faults: [ceShort('Q801'), open('R801')],
    note: 'masked pair: R801 open is invisible while Q801 is shorted',
  },
  { id: 'B09-zener-open', board: B09_ZENER, symptom: 'reference high, sensor readings wrong', start: [dcv('vz')], faults: [open('DZ901')] },
  { id: 'B09-zener-short', board: B09_ZENER, symptom: 'indicator dark, reference 0 V', start: [dcv('vz')], faults: [short('DZ901', 0.3)] },
  { id: 'B09-feed-drift', board: B09_ZENER, symptom: 'reference low', start: [dcv('vz')], faults: [drift('R901', 4)] },
  { id: 'B10-shunt-open', board: B10_SHUNT, symptom: 'overcurrent trip at every start', start: [dcv('cs')], faults: [open('RSH1')] },
  { id: 'B10-filter-r-open', board: B10_SHUNT, symptom: 'overcurrent trip at every start', start: [dcv('cs')], faults: [open('R1001')] },
  { id: 'B11-bootstrap-open', board: B11_BOOTSTRAP, symptom: 'one motor phase never switches', start: [dcv('vbu')], faults: [open('DBS1')] },
  { id: 'B11-choke-open', board: B11_BOOTSTRAP, symptom: 'gate drive dead, all phases', start: [dcv('vdd')], faults: [open('L1101')] },
  { id: 'B12-feedback-led-open', board: B12_FAN_DRIVE, symptom: 'F7 no speed feedback', start: [dcv('fo', 'gc')], faults: [ledOpen('XU601')] },
  { id: 'B12-switch-be-open', board: B12_FAN_DRIVE, symptom: 'F7 fan never starts', start: [dcv('vf'), dcv('fo', 'gc')], faults: [beOpen('Q401')] },
  { id: 'B12-speed-pullup-open', board: B12_FAN_DRIVE, symptom: 'fan never starts (speed command 0)', start: [dcv('vsp')], faults: [open('R502')] },
  {
    id: 'B12-cap+ce-short',
    board: B12_FAN_DRIVE,
    symptom: 'F7 fan never starts, 15 V rail low',
    start: [dcv('vf'), dcv('v15')],
    faults: [short('C401', 0.2), ceShort('Q401')],
    note: 'masked pair on a board of over 40 parts',
  },
  {
    id: 'B01-bridge-open',
    board: B01_BUS,
    symptom: 'bus sags and hums under load',
    start: [{ mode: 'diode', red: 'l', black: 'bus', power: 'off' }],
    faults: [open('D101')],
    note: 'starts with a diode test from the mains pin through the bridge',
  },
  // Boards with nothing wrong on them (the fault was in the motor or the wiring): the right answer is "no fault".
  { id: 'B04-healthy', board: B04_FAN_SWITCH, symptom: 'outdoor fan never starts (motor at fault)', start: [dcv('vf')], faults: [] },
  { id: 'B07-healthy', board: B07_THERMISTOR, symptom: 'F9 once, not repeatable', start: [dcv('th')], faults: [] },
];
