// Section templates of the motor's speed path: the opto-isolated speed command and the speed feedback (FG).
import { SPEED_COMMAND } from './bands';
import { C, collect, mk, net, num, OPTO, optoStage, R } from './parts';
import type { SectionTemplate, TemplatePart } from './types';

/** 4. Opto-isolated speed command: PWM duty → opto current → PNP stage → motor speed-command voltage. */
export const speedCommand: SectionTemplate = (ctx) => {
  const b = ctx.base,
    s = ctx.id;
  const sup = net(ctx, 'supply', 'v15sw'),
    gnd = net(ctx, 'hotGnd', '0'),
    gc = net(ctx, 'coldGnd', 'gnd_c');
  const vsp = net(ctx, 'out', 'vsp');
  const pwm = `${s}_pwm`,
    la = `${s}_la`,
    oc = `${s}_oc`,
    base = `${s}_b`,
    em = `${s}_e`;
  const rLed = 680;
  const ifMax = (5 - 1.2) / rLed; // MCU pin high 5 V, LED VF 1.2 V (PC817 datasheet typical)
  const rows: [TemplatePart, string][] = [
    ...optoStage(b, {
      drive: pwm,
      ledAnode: la,
      led: { ohms: rLed, label: '680R' },
      coldGnd: gc,
      hotGnd: gnd,
      collector: oc,
      bias: [R(`R${b + 2}`, sup, em, 4.7e3, '4k7'), R(`R${b + 3}`, sup, base, 1e3, '1k'), R(`R${b + 4}`, base, oc, 470, '470R')],
      pnp: { label: 'PNP small-signal', emitter: em, base, collector: vsp },
    }),
    R(`R${b + 5}`, vsp, gnd, 12e3, '12k'),
    R(`R${b + 6}`, vsp, gnd, 6.8e3, '6k8'),
    C(`C${b + 1}`, vsp, gnd, 1e-6, '1µ', false),
    C(`C${b + 2}`, base, sup, 10e-9, '10n', false),
    [
      mk(`ZD${b + 1}`, `DZ${b + 1}`, 'zener', '8V2 zener', 8.2, 0.05, 'do-35', [
        ['A', gnd],
        ['K', vsp],
      ]),
      `DZ${b + 1} ${gnd} ${vsp} DZ8V2`,
    ],
  ];
  const { parts, lines } = collect(rows);
  return {
    template: 'speed-command',
    title: 'Speed command (Vsp)',
    side: 'hot',
    touchesBus: false,
    netlist: [
      `* ${s}: speed command — MCU PWM averaged: LED current = DUTY·(5 V − VF)/R${b + 1} (common practice)`,
      `IMCU${b + 1} ${gc} ${pwm} {DUTY*${ifMax.toPrecision(6)}}`,
      ...lines,
    ].join('\n'),
    parts,
    params: { DUTY: 0.6 },
    nets: [
      { name: vsp, label: 'Speed command Vsp', side: 'hot', reference: gnd },
      { name: base, label: `Q${b + 1} base`, side: 'hot', reference: gnd },
      { name: oc, label: `PC${b + 1} collector`, side: 'hot', reference: gnd },
      { name: la, label: `PC${b + 1} LED anode (PWM)`, side: 'cold', reference: gc },
    ],
    testPoints: [
      { label: 'Speed command Vsp', net: vsp, reference: gnd, powerStates: ['on', 'off'], modes: ['dcv', 'ohm', 'diode'], band: SPEED_COMMAND },
      { label: `PC${b + 1} collector`, net: oc, reference: gnd, powerStates: ['on', 'off'], modes: ['dcv', 'ohm'] },
      { label: `PC${b + 1} LED anode (MCU PWM side)`, net: la, reference: gc, powerStates: ['on', 'off'], modes: ['dcv', 'diode'] },
    ],
    externals: [{ element: `IMCU${b + 1}`, description: 'Microcontroller PWM output, as its average LED current' }],
    uses: ['OPTO', 'QPNP', 'DZ8V2'],
  };
};

/** 5. Speed feedback: the motor's FG output, pull-up, opto back to the MCU. RPM = 60·f/PPR. */
export const speedFeedback: SectionTemplate = (ctx) => {
  const b = ctx.base,
    s = ctx.id;
  const sup = net(ctx, 'supply', 'v15sw'),
    gnd = net(ctx, 'hotGnd', '0'),
    gc = net(ctx, 'coldGnd', 'gnd_c');
  const vcc = net(ctx, 'coldVcc', 'vcc5_c'),
    fg = net(ctx, 'fg', 'fg');
  const a = `${s}_a`,
    oc = `${s}_oc`,
    mcu = net(ctx, 'mcuInput', `${s}_mcu_fg`);
  const rows: [TemplatePart, string][] = [
    R(`R${b + 1}`, sup, a, 4.7e3, '4k7'),
    R(`R${b + 2}`, a, fg, 10e3, '10k'),
    OPTO(`PC${b + 1}`, a, fg, oc, gc),
    [
      mk(`D${b + 1}`, `D${b + 1}`, 'diode', 'small-signal diode', undefined, undefined, 'do-35', [
        ['A', fg],
        ['K', a],
      ]),
      `D${b + 1} ${fg} ${a} DSIG`,
    ],
    R(`R${b + 3}`, vcc, oc, 10e3, '10k'),
    C(`C${b + 1}`, oc, gc, 1e-9, '1n', false),
    R(`R${b + 4}`, oc, mcu, 1e3, '1k'),
  ];
  const { parts, lines } = collect(rows);
  const ppr = num(ctx, 'pulsesPerRevolution', 4);
  return {
    template: 'speed-feedback',
    title: 'Speed feedback (FG)',
    side: 'hot',
    touchesBus: false,
    netlist: [
      `* ${s}: speed feedback — motor FG open-collector output (FG_LOW = 1: output transistor on) through an opto to the MCU`,
      `VMFG${b + 1} ${s}_mfg_d ${gnd} {5*FG_LOW}`,
      `RMFG${b + 1} ${s}_mfg_d ${s}_mfg_b 10k`,
      `QMFG${b + 1} ${fg} ${s}_mfg_b ${gnd} QNPN`,
      ...lines,
    ].join('\n'),
    parts: parts.map((p) => (p.designator === `PC${b + 1}` ? { ...p, params: { ...p.params, pulsesPerRevolution: ppr } } : p)),
    params: { FG_LOW: 1 },
    nets: [
      { name: fg, label: 'Motor FG (speed pulse) line', side: 'hot', reference: gnd },
      { name: a, label: `PC${b + 1} LED anode`, side: 'hot', reference: gnd },
      { name: oc, label: `PC${b + 1} collector (FG to MCU)`, side: 'cold', reference: gc },
    ],
    testPoints: [
      { label: 'Motor FG line', net: fg, reference: gnd, powerStates: ['on', 'off'], modes: ['dcv', 'ohm', 'diode'] },
      { label: 'FG to MCU (opto collector)', net: oc, reference: gc, powerStates: ['on', 'off'], modes: ['dcv', 'ohm'] },
    ],
    externals: [
      { element: `VMFG${b + 1}`, description: 'Motor internal FG driver state', motor: true },
      { element: `RMFG${b + 1}`, description: 'Motor internal FG driver base resistor', motor: true },
      { element: `QMFG${b + 1}`, description: 'Motor FG open-collector output transistor', motor: true },
    ],
    uses: ['OPTO', 'DSIG', 'QNPN'],
  };
};

/** Motor speed from the FG frequency: RPM = 60·f / pulses-per-revolution (TI DRV10975 datasheet, FG output). */
export function rpmFromFg(frequencyHz: number, pulsesPerRevolution: number): number {
  if (!(pulsesPerRevolution > 0)) throw new RangeError('pulses per revolution must be positive');
  return (60 * frequencyHz) / pulsesPerRevolution;
}
/** FG frequency for a speed: f = RPM·PPR/60. */
export function fgFromRpm(rpm: number, pulsesPerRevolution: number): number {
  return (rpm * pulsesPerRevolution) / 60;
}
/** Pulses per revolution of a motor whose FG toggles once per electrical cycle: poles/2 (TI DRV10975 datasheet). */
export function pulsesPerRevolutionFromPoles(poles: number): number {
  if (!Number.isInteger(poles) || poles < 2 || poles % 2) throw new RangeError('poles must be an even integer ≥ 2');
  return poles / 2;
}
