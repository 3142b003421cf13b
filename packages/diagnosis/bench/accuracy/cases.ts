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
const dcvs = (...reds: string[]): Probe[] => reds.map((r) => dcv(r));
const beep = (red: string, black = '0'): Probe => ({ mode: 'continuity', red, black, power: 'off' });

/**
 * One case: the board, the symptom the unit came in with, the first readings (a net name is a powered DC V reading
 * to ground) and the faults; `more` adds the board's parameters and the note for the table's reader.
 */
function kase(
  id: string,
  board: BenchBoard,
  symptom: string,
  start: string | Probe[],
  faults: TrueFault[],
  more: Pick<BenchCase, 'params' | 'note'> = {},
): BenchCase {
  return {
    id,
    board,
    ...(more.params ? { params: more.params } : {}),
    symptom,
    faults,
    start: typeof start === 'string' ? [dcv(start)] : start,
    ...(more.note ? { note: more.note } : {}),
  };
}

export const CASES: BenchCase[] = [
  // Model: with C101 open the bus is the unsmoothed full-wave rectified mains; a DC meter reads its mean
  // (2√2/π·Vrms less the bridge drops), which the transient ground truth computes directly.
  kase(
    'B01-bulk-open',
    B01_BUS,
    'F3 bus voltage out of range',
    'bus',
    [fault('C101', { do: 'open' }, 'C101 bulk capacitor open (dried out)', /open|dry|dried|capacit/)],
    {
      note: 'not in the DC model: the honest answer is "not explained"',
    },
  ),
  kase('B01-sense-drift', B01_BUS, 'F3 bus voltage out of range', 'bs', [drift('R103', 2.5)]),
  kase('B01-bridge-short', B01_BUS, 'mains fuse blown, board dead', [beep('n', '0')], [short('D104', 0.5)], {
    note: 'starts unpowered; a powered test on it is a hazard',
  }),
  kase('B02-zener-short', B02_REG15, 'no 15 V, board dead', 'v15', [short('DZ201', 0.3)]),
  kase('B02-pass-be-open', B02_REG15, 'no 15 V, board dead', 'v15', [beOpen('Q201')]),
  kase('B02-cap-short', B02_REG15, 'no 15 V, board dead', 'v15', [short('C203', 0.2)]),
  kase('B03-reg-dead', B03_REG5, 'controller dead, no 5 V', 'v5', [
    fault('XU301', { do: 'inner', element: 'QPASS', inner: { do: 'open' } }, 'XU301 regulator dead (no output)', /^dead$/),
  ]),
  kase('B03-cap-short', B03_REG5, 'controller dead, no 5 V', 'v5', [short('C302', 0.2)]),
  kase('B04-led-open', B04_FAN_SWITCH, 'outdoor fan never starts', 'vf', [ledOpen('XU401')]),
  kase('B04-switch-be-open', B04_FAN_SWITCH, 'outdoor fan never starts', 'vf', [beOpen('Q401')]),
  kase('B04-drive-r-open', B04_FAN_SWITCH, 'outdoor fan never starts', 'vf', [open('R402')]),
  kase('B04-cap+ce-short', B04_FAN_SWITCH, 'outdoor fan never starts, 15 V rail low', dcvs('vf', 'v15'), [short('C401', 0.2), ceShort('Q401')], {
    note: 'masked pair: the C–E short shows nothing alone with the fan on',
  }),
  kase('B04-ce-short+led-open', B04_FAN_SWITCH, 'fan runs when the controller stops it', 'vf', [ceShort('Q401'), ledOpen('XU401')], {
    params: { FANON: 0 },
    note: 'masked pair: the LED open is invisible while Q401 conducts; only an unpowered test of the LED shows it',
  }),
  kase('B05-led-open', B05_SPEED_CMD, 'fan always at full speed', 'vsp', [ledOpen('XU501')]),
  kase('B05-pullup-open', B05_SPEED_CMD, 'fan never starts (speed command 0)', 'vsp', [open('R502')]),
  kase('B05-ctr-low', B05_SPEED_CMD, 'fan runs faster than commanded', 'vsp', [
    fault('XU501', { do: 'inner', element: 'FCT', inner: { do: 'scale', factor: 0.35 } }, 'XU501 opto — CTR degraded to 35 %', /^fct:drift/),
  ]),
  kase('B05-follower-ce-short', B05_SPEED_CMD, 'fan always at full speed', 'vsp', [ceShort('Q501')]),
  kase('B06-led-r-open', B06_FEEDBACK, 'F7 no speed feedback', [dcv('fo', 'gc')], [open('R601')]),
  kase('B06-clamp-short', B06_FEEDBACK, 'F7 no speed feedback', [dcv('fin', 'gc')], [short('D601', 0.5)]),
  kase('B07-sensor-open', B07_THERMISTOR, 'F9 coil sensor out of range', 'th', [open('RTH701')]),
  kase('B07-filter-short', B07_THERMISTOR, 'F9 coil sensor out of range', 'adc', [short('C701', 0.3)]),
  kase('B07-pullup-drift', B07_THERMISTOR, 'coil temperature reads wrong', 'th', [drift('R701', 2.2)]),
  kase('B08-be-open', B08_RELAY, 'relay never clicks', 'rc', [beOpen('Q801')]),
  kase('B08-flyback-short', B08_RELAY, 'relay never clicks', 'rc', [short('D801', 0.5)]),
  kase('B08-base-r-open', B08_RELAY, 'relay never clicks', 'rc', [open('R801')]),
  kase('B08-ce-short+base-open', B08_RELAY, 'relay stays on when switched off', 'rc', [ceShort('Q801'), open('R801')], {
    params: { RLY: 0 },
    note: 'masked pair: R801 open is invisible while Q801 is shorted',
  }),
  kase('B09-zener-open', B09_ZENER, 'reference high, sensor readings wrong', 'vz', [open('DZ901')]),
  kase('B09-zener-short', B09_ZENER, 'indicator dark, reference 0 V', 'vz', [short('DZ901', 0.3)]),
  kase('B09-feed-drift', B09_ZENER, 'reference low', 'vz', [drift('R901', 4)]),
  kase('B10-shunt-open', B10_SHUNT, 'overcurrent trip at every start', 'cs', [open('RSH1')]),
  kase('B10-filter-r-open', B10_SHUNT, 'overcurrent trip at every start', 'cs', [open('R1001')]),
  kase('B11-bootstrap-open', B11_BOOTSTRAP, 'one motor phase never switches', 'vbu', [open('DBS1')]),
  kase('B11-choke-open', B11_BOOTSTRAP, 'gate drive dead, all phases', 'vdd', [open('L1101')]),
  kase('B12-feedback-led-open', B12_FAN_DRIVE, 'F7 no speed feedback', [dcv('fo', 'gc')], [ledOpen('XU601')]),
  kase('B12-switch-be-open', B12_FAN_DRIVE, 'F7 fan never starts', [dcv('vf'), dcv('fo', 'gc')], [beOpen('Q401')]),
  kase('B12-speed-pullup-open', B12_FAN_DRIVE, 'fan never starts (speed command 0)', 'vsp', [open('R502')]),
  kase('B12-cap+ce-short', B12_FAN_DRIVE, 'F7 fan never starts, 15 V rail low', dcvs('vf', 'v15'), [short('C401', 0.2), ceShort('Q401')], {
    note: 'masked pair on a board of over 40 parts',
  }),
  kase('B01-bridge-open', B01_BUS, 'bus sags and hums under load', [{ mode: 'diode', red: 'l', black: 'bus', power: 'off' }], [open('D101')], {
    note: 'starts with a diode test from the mains pin through the bridge',
  }),
  // Boards with nothing wrong on them (the fault was in the motor or the wiring): the right answer is "no fault".
  kase('B04-healthy', B04_FAN_SWITCH, 'outdoor fan never starts (motor at fault)', 'vf', []),
  kase('B07-healthy', B07_THERMISTOR, 'F9 once, not repeatable', 'th', []),
];
