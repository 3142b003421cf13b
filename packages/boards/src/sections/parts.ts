// Building blocks the section templates share: a part with its netlist line, and param/net lookups with defaults.
import { OPTO_CTR } from './library';
import type { SectionContext, TemplatePart } from './types';

export const num = (ctx: SectionContext, k: string, d: number): number => {
  const v = ctx.params[k];
  return typeof v === 'number' ? v : typeof v === 'string' && v.trim() !== '' && !Number.isNaN(Number(v)) ? Number(v) : d;
};
export const net = (ctx: SectionContext, k: string, d: string): string => ctx.nets[k] ?? d;

export type PartArgs = [
  kind: TemplatePart['kind'],
  value: string,
  nominal: number | undefined,
  tolerance: number | undefined,
  pkg: string,
  pins: [string, string][],
];

export function mk(designator: string, element: string | undefined, ...[kind, value, nominal, tolerance, pkg, pins]: PartArgs): TemplatePart {
  const p: TemplatePart = { designator, kind, value, package: pkg, pins: pins.map(([pin, n]) => ({ pin, net: n })) };
  if (element) p.element = element;
  if (nominal !== undefined) p.nominal = nominal;
  if (tolerance !== undefined) p.tolerance = tolerance;
  return p;
}
export const R = (d: string, a: string, b: string, ohms: number, label: string, tol = 0.05, pkg = 'axial-0207'): [TemplatePart, string] => [
  mk(d, d, 'resistor', label, ohms, tol, pkg, [
    ['1', a],
    ['2', b],
  ]),
  `${d} ${a} ${b} ${ohms}`,
];
export const C = (d: string, a: string, b: string, farads: number, label: string, electrolytic: boolean): [TemplatePart, string] => [
  mk(d, d, electrolytic ? 'electrolytic-capacitor' : 'ceramic-capacitor', label, farads, electrolytic ? 0.2 : 0.1, electrolytic ? 'radial-e' : 'disc-2.5', [
    ['+', a],
    ['-', b],
  ]),
  `${d} ${a} ${b} ${farads}`,
];
export const OPTO = (d: string, a: string, k: string, c: string, e: string): [TemplatePart, string] => {
  const p = mk(d, `X${d}`, 'opto-coupler', 'opto-coupler, CTR 130 %', undefined, undefined, 'dip-4', [
    ['1', a],
    ['2', k],
    ['3', e],
    ['4', c],
  ]);
  p.params = { ctr: OPTO_CTR };
  return [p, `X${d} ${a} ${k} ${c} ${e} OPTO`];
};

export function collect(rows: [TemplatePart, string][]): { parts: TemplatePart[]; lines: string[] } {
  return { parts: rows.map((r) => r[0]), lines: rows.map((r) => r[1]) };
}

/** The nets of an opto-driven PNP stage; `bias` are the stage's own base/emitter resistors, in designator order. */
export interface OptoStage {
  /** The cold-side drive (MCU pin) and the LED anode net between the LED resistor and the opto. */
  drive: string;
  ledAnode: string;
  led: { ohms: number; label: string };
  coldGnd: string;
  hotGnd: string;
  /** The opto's collector, which pulls the PNP's base down through the bias network. */
  collector: string;
  bias: [TemplatePart, string][];
  pnp: { label: string; emitter: string; base: string; collector: string };
}

/**
 * LED resistor R(b+1) → opto PC(b+1) → bias resistors → PNP Q(b+1): the stage the fan switch and the speed command
 * share (an MCU pin lights the LED, the opto's transistor turns the hot-side PNP on).
 */
export function optoStage(b: number, s: OptoStage): [TemplatePart, string][] {
  const q = `Q${b + 1}`;
  return [
    R(`R${b + 1}`, s.drive, s.ledAnode, s.led.ohms, s.led.label),
    OPTO(`PC${b + 1}`, s.ledAnode, s.coldGnd, s.collector, s.hotGnd),
    ...s.bias,
    [
      mk(q, q, 'bjt', s.pnp.label, undefined, undefined, 'to-92', [
        ['E', s.pnp.emitter],
        ['B', s.pnp.base],
        ['C', s.pnp.collector],
      ]),
      `${q} ${s.pnp.collector} ${s.pnp.base} ${s.pnp.emitter} QPNP`,
    ],
  ];
}
