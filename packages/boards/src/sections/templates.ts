/**
 * Section templates of an inverter fan-motor drive. Each is a pure function of its context (id, designator base,
 * board nets, params) and returns a SPICE-subset fragment plus metadata. Element names are designators
 * (R101, C203, XU201 for U201, XPC301 for PC301), internal nodes are prefixed with the section id, so sections
 * compose without clashes and meet on the nets the board names.
 * Hot side = bus negative "0"; cold side = microcontroller ground (board net, e.g. "gnd_c").
 */
import { busBand, RAIL_15V, RAIL_5V, REG15_INPUT, REG5_INPUT, SWITCHED_15V } from './bands';
import { C, collect, mk, net, num, OPTO, optoStage, R } from './parts';
import { thermistorSense } from './sensing';
import type { SectionContext, SectionOutput, SectionTemplate, TemplatePart } from './types';
import { speedCommand, speedFeedback } from './speed';

/** 1. DC bus: mains as its DC peak equivalent through a full bridge, bulk capacitor, bleeder. */
export const dcBus: SectionTemplate = (ctx) => {
  const b = ctx.base;
  const s = ctx.id;
  const vbus = net(ctx, 'bus', 'vbus');
  const gnd = net(ctx, 'hotGnd', '0');
  const cap = num(ctx, 'bulkF', 470e-6);
  const bleed = num(ctx, 'bleederOhms', 150e3);
  const rms = num(ctx, 'mainsRms', 230);
  const tol = num(ctx, 'mainsTolerance', 0.1);
  const acl = `${s}_acl`,
    acn = `${s}_acn`,
    bl = `${s}_l`,
    bn = `${s}_n`,
    mid = `${s}_mid`;
  const rows: [TemplatePart, string][] = [
    [
      mk(`F${b + 1}`, `RF${b + 1}`, 'fuse', 'T3.15A 250V', 0.05, undefined, 'fuse-5x20', [
        ['1', acl],
        ['2', bl],
      ]),
      `RF${b + 1} ${acl} ${bl} 0.05`,
    ],
    [
      mk(`TH${b + 1}`, `RTH${b + 1}`, 'thermistor', 'NTC 10R', 10, 0.2, 'disc-7', [
        ['1', acn],
        ['2', bn],
      ]),
      `RTH${b + 1} ${acn} ${bn} 10`,
    ],
    [
      mk(`D${b + 1}`, `D${b + 1}`, 'diode', '1 A 1000 V rectifier', undefined, undefined, 'do-41', [
        ['A', bl],
        ['K', vbus],
      ]),
      `D${b + 1} ${bl} ${vbus} DRECT`,
    ],
    [
      mk(`D${b + 2}`, `D${b + 2}`, 'diode', '1 A 1000 V rectifier', undefined, undefined, 'do-41', [
        ['A', bn],
        ['K', vbus],
      ]),
      `D${b + 2} ${bn} ${vbus} DRECT`,
    ],
    [
      mk(`D${b + 3}`, `D${b + 3}`, 'diode', '1 A 1000 V rectifier', undefined, undefined, 'do-41', [
        ['A', gnd],
        ['K', bl],
      ]),
      `D${b + 3} ${gnd} ${bl} DRECT`,
    ],
    [
      mk(`D${b + 4}`, `D${b + 4}`, 'diode', '1 A 1000 V rectifier', undefined, undefined, 'do-41', [
        ['A', gnd],
        ['K', bn],
      ]),
      `D${b + 4} ${gnd} ${bn} DRECT`,
    ],
    C(`C${b + 1}`, vbus, gnd, cap, `${Math.round(cap * 1e6)}µ 400V`, true),
    [
      mk(`C${b + 2}`, `C${b + 2}`, 'film-capacitor', '100n 630V', 100e-9, 0.1, 'film-box', [
        ['1', vbus],
        ['2', gnd],
      ]),
      `C${b + 2} ${vbus} ${gnd} 100n`,
    ],
    R(`R${b + 1}`, vbus, mid, bleed, `${bleed / 1e3}k 1W`, 0.05, 'axial-0414'),
    R(`R${b + 2}`, mid, gnd, bleed, `${bleed / 1e3}k 1W`, 0.05, 'axial-0414'),
  ];
  const { parts, lines } = collect(rows);
  const vpk = Math.SQRT2 * rms;
  return {
    template: 'dc-bus',
    title: 'DC bus',
    side: 'hot',
    touchesBus: true,
    netlist: [
      `* ${s}: DC bus — mains (${rms} V rms) as its DC peak equivalent √2·Vrms = ${vpk.toFixed(1)} V through the bridge`,
      `VAC${b + 1} ${acl} ${acn} {sqrt(2)*MAINS_RMS}`,
      ...lines,
    ].join('\n'),
    parts,
    params: { MAINS_RMS: rms },
    nets: [
      { name: vbus, label: 'DC bus +', side: 'hot', reference: gnd },
      { name: acl, label: 'Mains L (after CN)', side: 'hot', reference: gnd },
      { name: acn, label: 'Mains N (after CN)', side: 'hot', reference: gnd },
      { name: mid, label: 'Bleeder midpoint', side: 'hot', reference: gnd },
    ],
    testPoints: [
      {
        label: 'DC bus + (bulk capacitor)',
        net: vbus,
        reference: gnd,
        powerStates: ['on', 'off'],
        modes: ['dcv', 'ohm', 'diode'],
        band: busBand(rms, tol),
      },
      { label: 'Bleeder midpoint', net: mid, reference: gnd, powerStates: ['on', 'off'], modes: ['dcv', 'ohm'] },
    ],
    externals: [{ element: `VAC${b + 1}`, description: 'Mains supply (DC peak equivalent of the rectified line)' }],
    uses: ['DRECT'],
  };
};

/** 2. 15 V linear regulator (78xx) from an auxiliary supply. */
export const regulator15: SectionTemplate = (ctx) => regulator(ctx, 15);
/** 5 V linear regulator (7805) for the microcontroller, cold side. */
export const regulator5: SectionTemplate = (ctx) => regulator(ctx, 5);

function regulator(ctx: SectionContext, vout: 15 | 5): SectionOutput {
  const b = ctx.base,
    s = ctx.id;
  const cold = vout === 5;
  const gnd = net(ctx, 'gnd', cold ? 'gnd_c' : '0');
  const out = net(ctx, 'out', cold ? 'vcc5_c' : 'v15');
  const aux = `${s}_aux`,
    vin = `${s}_vin`,
    led = `${s}_led`;
  const auxParam = cold ? 'AUX5_V' : 'AUX15_V';
  const auxV = num(ctx, 'auxVolts', cold ? 9 : 19);
  const rows: [TemplatePart, string][] = [
    [
      mk(`D${b + 1}`, `D${b + 1}`, 'diode', 'fast rectifier', undefined, undefined, 'do-41', [
        ['A', aux],
        ['K', vin],
      ]),
      `D${b + 1} ${aux} ${vin} DSIG`,
    ],
    C(`C${b + 1}`, vin, gnd, cold ? 220e-6 : 100e-6, cold ? '220µ 25V' : '100µ 35V', true),
    C(`C${b + 2}`, vin, gnd, 330e-9, '330n', false),
    [
      mk(`U${b + 1}`, `XU${b + 1}`, 'regulator', `78${String(vout).padStart(2, '0')} ${vout} V regulator`, vout, 0.04, 'to-220', [
        ['1', vin],
        ['2', gnd],
        ['3', out],
      ]),
      `XU${b + 1} ${vin} ${out} ${gnd} REG78${String(vout).padStart(2, '0')}`,
    ],
    C(`C${b + 3}`, out, gnd, 100e-9, '100n', false),
    C(`C${b + 4}`, out, gnd, 47e-6, cold ? '47µ 16V' : '47µ 25V', true),
    R(`R${b + 1}`, out, led, cold ? 1e3 : 3.3e3, cold ? '1k' : '3k3'),
    [
      mk(`LED${b + 1}`, `DLED${b + 1}`, 'led', 'red LED', undefined, undefined, 'led-3mm', [
        ['A', led],
        ['K', gnd],
      ]),
      `DLED${b + 1} ${led} ${gnd} DLED_R`,
    ],
  ];
  const { parts, lines } = collect(rows);
  const inBand = cold ? REG5_INPUT : REG15_INPUT;
  return {
    template: cold ? 'regulator-5v' : 'regulator-15v',
    title: cold ? '5 V regulator (microcontroller supply)' : '15 V regulator (motor control supply)',
    side: cold ? 'cold' : 'hot',
    touchesBus: false,
    netlist: [
      `* ${s}: ${vout} V 78xx regulator from the auxiliary winding (${auxV} V DC equivalent)`,
      `VAUX${b + 1} ${aux} ${gnd} {${auxParam}}`,
      ...lines,
    ].join('\n'),
    parts,
    params: { [auxParam]: auxV },
    nets: [
      { name: aux, label: `Aux winding ${cold ? '(cold)' : '(hot)'}`, side: cold ? 'cold' : 'hot', reference: gnd },
      { name: vin, label: `${vout} V regulator input`, side: cold ? 'cold' : 'hot', reference: gnd },
      { name: out, label: `${vout} V rail`, side: cold ? 'cold' : 'hot', reference: gnd },
    ],
    testPoints: [
      { label: `U${b + 1} input`, net: vin, reference: gnd, powerStates: ['on', 'off'], modes: ['dcv', 'ohm', 'diode'], band: inBand },
      {
        label: `${vout} V rail (U${b + 1} output)`,
        net: out,
        reference: gnd,
        powerStates: ['on', 'off'],
        modes: ['dcv', 'ohm', 'diode'],
        band: cold ? RAIL_5V : RAIL_15V,
      },
    ],
    externals: [{ element: `VAUX${b + 1}`, description: 'Auxiliary winding of the switch-mode supply (rectified DC equivalent)' }],
    uses: ['DSIG', 'DLED_R', cold ? 'REG7805' : 'REG7815'],
  };
}

/** 3. High-side PNP switch for the motor's 15 V supply, opto-driven, with a second opto reporting the rail. */
export const fanSwitch: SectionTemplate = (ctx) => {
  const b = ctx.base,
    s = ctx.id;
  const v15 = net(ctx, 'in', 'v15'),
    sw = net(ctx, 'out', 'v15sw'),
    gnd = net(ctx, 'hotGnd', '0');
  const gc = net(ctx, 'coldGnd', 'gnd_c'),
    vcc = net(ctx, 'coldVcc', 'vcc5_c');
  const drv = net(ctx, 'mcuDrive', `${s}_mcu_on`),
    fbk = net(ctx, 'mcuSense', `${s}_mcu_sense`);
  const la = `${s}_la`,
    oc = `${s}_oc`,
    base = `${s}_b`,
    fa = `${s}_fa`,
    fc = `${s}_fc`;
  const rows: [TemplatePart, string][] = [
    ...optoStage(b, {
      drive: drv,
      ledAnode: la,
      led: { ohms: 330, label: '330R' },
      coldGnd: gc,
      hotGnd: gnd,
      collector: oc,
      bias: [R(`R${b + 2}`, oc, base, 4.7e3, '4k7'), R(`R${b + 3}`, v15, base, 10e3, '10k')],
      pnp: { label: 'PNP 0.5 A', emitter: v15, base, collector: sw },
    }),
    C(`C${b + 1}`, sw, gnd, 100e-9, '100n', false),
    C(`C${b + 2}`, sw, gnd, 47e-6, '47µ 25V', true),
    R(`R${b + 4}`, sw, fa, 3.3e3, '3k3'),
    OPTO(`PC${b + 2}`, fa, gnd, fc, gc),
    R(`R${b + 5}`, vcc, fc, 10e3, '10k'),
    C(`C${b + 3}`, fc, gc, 1e-9, '1n', false),
    R(`R${b + 6}`, fc, fbk, 1e3, '1k'),
  ];
  const { parts, lines } = collect(rows);
  return {
    template: 'fan-switch',
    title: 'Fan 15 V high-side switch',
    side: 'hot',
    touchesBus: false,
    netlist: [
      `* ${s}: high-side PNP switch, opto-driven from the MCU (FAN_ON), rail reported back by a second opto`,
      `VMCU${b + 1} ${drv} ${gc} {5*FAN_ON}`,
      ...lines,
    ].join('\n'),
    parts,
    params: { FAN_ON: 1 },
    nets: [
      { name: sw, label: 'Switched 15 V (motor Vcc)', side: 'hot', reference: gnd },
      { name: base, label: `Q${b + 1} base`, side: 'hot', reference: gnd },
      { name: oc, label: `PC${b + 1} collector`, side: 'hot', reference: gnd },
      { name: drv, label: 'MCU fan-on output', side: 'cold', reference: gc },
      { name: la, label: `PC${b + 1} LED anode`, side: 'cold', reference: gc },
      { name: fc, label: `PC${b + 2} collector (rail sense to MCU)`, side: 'cold', reference: gc },
    ],
    testPoints: [
      { label: 'Switched 15 V rail (motor Vcc)', net: sw, reference: gnd, powerStates: ['on', 'off'], modes: ['dcv', 'ohm', 'diode'], band: SWITCHED_15V },
      { label: `Q${b + 1} base`, net: base, reference: gnd, powerStates: ['on', 'off'], modes: ['dcv', 'ohm', 'diode'] },
      { label: `PC${b + 1} LED anode (MCU side)`, net: la, reference: gc, powerStates: ['on', 'off'], modes: ['dcv', 'diode'] },
      { label: 'Rail sense to MCU', net: fc, reference: gc, powerStates: ['on', 'off'], modes: ['dcv', 'ohm'] },
    ],
    externals: [{ element: `VMCU${b + 1}`, description: 'Microcontroller fan-on output pin (5 V when FAN_ON = 1)' }],
    uses: ['OPTO', 'QPNP'],
  };
};

export const TEMPLATES: Record<string, SectionTemplate> = {
  'dc-bus': dcBus,
  'regulator-15v': regulator15,
  'regulator-5v': regulator5,
  'fan-switch': fanSwitch,
  'speed-command': speedCommand,
  'speed-feedback': speedFeedback,
  'thermistor-sense': thermistorSense,
};
