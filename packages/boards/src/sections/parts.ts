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
