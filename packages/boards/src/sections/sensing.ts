/**
 * Thermistor input: an NTC sensor on a lead (room or coil temperature) in a divider with a pull-up from the
 * controller's 5 V, filtered into an ADC pin. Cold side. The sensor plugs into the board, so it is an external
 * element whose resistance follows the β model R(T) = R25·exp(β·(1/T − 1/T25)) (the usual NTC datasheet
 * form; β 3950 K is a common NTC value, from memory).
 */
import { C, collect, net, num, R } from './parts';
import type { SectionTemplate, TemplatePart } from './types';

/** NTC resistance at a temperature (β model, T in kelvin inside). */
export function ntcResistance(r25: number, beta: number, celsius: number): number {
  const t = celsius + 273.15;
  return r25 * Math.exp(beta * (1 / t - 1 / 298.15));
}

export const thermistorSense: SectionTemplate = (ctx) => {
  const b = ctx.base,
    s = ctx.id;
  const vcc = net(ctx, 'coldVcc', 'vcc5_c'),
    gc = net(ctx, 'coldGnd', 'gnd_c');
  const th = net(ctx, 'sensor', `${s}_th`),
    adc = net(ctx, 'mcuInput', `${s}_adc`);
  const r25 = num(ctx, 'r25', 10e3),
    beta = num(ctx, 'beta', 3950),
    celsius = num(ctx, 'celsius', 25);
  const pull = num(ctx, 'pullUpOhms', 10e3);
  const rows: [TemplatePart, string][] = [
    R(`R${b + 1}`, vcc, th, pull, `${pull / 1e3}k 1%`, 0.01, '0805'),
    R(`R${b + 2}`, th, adc, 1e3, '1k', 0.05, '0805'),
    C(`C${b + 1}`, adc, gc, 100e-9, '100n', false),
    C(`C${b + 2}`, th, gc, 10e-9, '10n', false),
  ];
  const { parts, lines } = collect(rows);
  const rt = ntcResistance(r25, beta, celsius);
  return {
    template: 'thermistor-sense',
    title: 'Thermistor input',
    side: 'cold',
    touchesBus: false,
    netlist: [
      `* ${s}: NTC sensor on a lead (${(r25 / 1e3).toPrecision(3)}k at 25 °C, β ${beta} K) at ${celsius} °C = ${rt.toPrecision(4)} Ω, pull-up to the 5 V rail`,
      `RSENS${b + 1} ${th} ${gc} ${rt.toPrecision(6)}`,
      ...lines,
    ].join('\n'),
    parts,
    params: {},
    nets: [
      { name: th, label: 'Thermistor divider', side: 'cold', reference: gc },
      { name: adc, label: 'Thermistor ADC input', side: 'cold', reference: gc },
    ],
    testPoints: [{ label: 'Thermistor divider', net: th, reference: gc, powerStates: ['on', 'off'], modes: ['dcv', 'ohm'] }],
    externals: [{ element: `RSENS${b + 1}`, description: `NTC sensor on its lead at ${celsius} °C` }],
    uses: [],
  };
};
