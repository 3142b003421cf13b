/**
 * Fast fault simulation (fault-sim.ts) against full solves of the faulted circuit. "Equal" is within the ngspice
 * defaults of the DC operating point (ngspice manual, ch. 15 ".options": RELTOL 1e-3, VNTOL 1 µV): a voltage v'
 * of the fast path agrees with the full solve's v when |v' − v| ≤ RELTOL·max(|v|, |v'|) + VNTOL.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { diode, isource, resistor, solveNodes, vsource, type Circuit, type Element } from './index';
import { HealthyFactor } from './fault-sim';
import { rubberStamps } from './rubber-stamps';

const RELTOL = 1e-3;
const VNTOL = 1e-6;

function expectClose(fast: number, full: number): void {
  expect(Math.abs(fast - full)).toBeLessThanOrEqual(RELTOL * Math.max(Math.abs(fast), Math.abs(full)) + VNTOL);
}

/** Compares every net of the faulted circuit solved in full with the fast solve from the healthy factors. */
function checkFault(healthy: Circuit, faulted: Circuit): string {
  const stamps = rubberStamps(healthy, faulted);
  expect(stamps).toBeDefined();
  const hf = HealthyFactor.prepare(healthy);
  expect(hf).toBeDefined();
  const fast = (hf as HealthyFactor).solve(stamps ?? []);
  const full = solveNodes(faulted);
  for (const [net, v] of Object.entries(full.nodes())) expectClose(fast.voltage(net), v);
  return fast.method;
}

interface Net {
  nodes: number;
  edges: { a: number; b: number; r: number }[];
  source: number;
  injections: { node: number; amps: number }[];
}

// Random connected resistor networks: a spanning tree to the reference, extra edges, a voltage source and current
// injections.
const netArb: fc.Arbitrary<Net> = fc
  .integer({ min: 3, max: 14 })
  .chain((nodes) =>
    fc.record({
      nodes: fc.constant(nodes),
      tree: fc.tuple(...Array.from({ length: nodes - 1 }, (_, i) => fc.tuple(fc.integer({ min: 0, max: i }), fc.double({ min: 1, max: 1e5, noNaN: true })))),
      extra: fc.array(fc.tuple(fc.integer({ min: 0, max: nodes - 1 }), fc.integer({ min: 0, max: nodes - 1 }), fc.double({ min: 1, max: 1e5, noNaN: true })), {
        maxLength: 20,
      }),
      source: fc.double({ min: -300, max: 300, noNaN: true }),
      injections: fc.array(fc.record({ node: fc.integer({ min: 1, max: nodes - 1 }), amps: fc.double({ min: -0.1, max: 0.1, noNaN: true }) }), {
        maxLength: 4,
      }),
    }),
  )
  .map(({ nodes, tree, extra, source, injections }) => ({
    nodes,
    edges: [...tree.map(([a, r], i) => ({ a, b: i + 1, r })), ...extra.filter(([a, b]) => a !== b).map(([a, b, r]) => ({ a, b, r }))],
    source,
    injections,
  }));

const name = (i: number) => (i === 0 ? '0' : `n${i}`);

function build(net: Net): Circuit {
  const elements: Element[] = net.edges.map((e, i) => resistor(`R${i}`, name(e.a), name(e.b), e.r));
  elements.push(resistor('RS', 'src', name(1), 10), vsource('V1', 'src', '0', net.source));
  net.injections.forEach((j, i) => elements.push(isource(`I${i}`, '0', name(j.node), j.amps)));
  return { title: 'random', elements, nets: ['0', 'src', ...Array.from({ length: net.nodes - 1 }, (_, i) => name(i + 1))], params: {} };
}

type Fault = { kind: 'open' | 'short' | 'drift'; edge: number; k: number } | { kind: 'bridge'; a: number; b: number; ohms: number };

const faultArb = (net: Net): fc.Arbitrary<Fault> =>
  fc.oneof(
    fc.record({
      kind: fc.constantFrom('open' as const, 'short' as const, 'drift' as const),
      edge: fc.integer({ min: 0, max: net.edges.length - 1 }),
      k: fc.double({ min: 0.05, max: 20, noNaN: true }),
    }),
    fc.record({
      kind: fc.constant('bridge' as const),
      a: fc.integer({ min: 0, max: net.nodes - 1 }),
      b: fc.integer({ min: 0, max: net.nodes - 1 }),
      ohms: fc.double({ min: 0.1, max: 1e6, noNaN: true }),
    }),
  );

/** The fault written into the circuit as the diagnosis does (faults.ts): the element replaced or a part added. */
function applyFault(c: Circuit, f: Fault, i: number): Circuit {
  if (f.kind === 'bridge') return { ...c, elements: [...c.elements, resistor(`RF${i}`, name(f.a), name(f.b), f.ohms)] };
  const ohms = { open: 1e9, short: 0.1, drift: 0 }[f.kind];
  return {
    ...c,
    elements: c.elements.map((e) => (e.name === `R${f.edge}` && e.kind === 'R' ? { ...e, value: f.kind === 'drift' ? e.value * f.k : ohms } : e)),
  };
}

describe('fast fault simulation (Sherman–Morrison–Woodbury from the healthy factors)', () => {
  it('equals a full solve on random linear networks (open, short, drift, bridge)', () => {
    fc.assert(
      fc.property(
        netArb.chain((net) => fc.tuple(fc.constant(net), fc.array(faultArb(net), { minLength: 1, maxLength: 2 }))),
        ([net, faults]) => {
          const healthy = build(net);
          const faulted = faults.reduce((c, f, i) => applyFault(c, f, i), healthy);
          expect(checkFault(healthy, faulted)).toBe('woodbury');
        },
      ),
      { numRuns: 120, seed: 16 },
    );
  }, 60_000);

  it('continues Newton from the healthy solution on a diode circuit and matches the full solve', () => {
    const healthy: Circuit = {
      title: 'diode divider',
      elements: [
        vsource('V1', 'in', '0', 15),
        resistor('R1', 'in', 'a', 1e3),
        diode('D1', 'a', 'b'),
        resistor('R2', 'b', '0', 2.2e3),
        resistor('R3', 'a', '0', 10e3),
      ],
      nets: ['0', 'in', 'a', 'b'],
      params: {},
    };
    const drifted = { ...healthy, elements: healthy.elements.map((e) => (e.name === 'R2' && e.kind === 'R' ? { ...e, value: 3.3e3 } : e)) };
    expect(checkFault(healthy, drifted)).toBe('newton-woodbury');
    // a short across the diode moves its junction far from the healthy point: still exact, by whichever path
    const shorted = { ...healthy, elements: [...healthy.elements, resistor('RF', 'a', 'b', 0.5)] };
    expect(['newton-woodbury', 'full']).toContain(checkFault(healthy, shorted));
  });

  it('refuses changes that are not conductance stamps (a diode removed, a new net)', () => {
    const c: Circuit = {
      title: 't',
      elements: [vsource('V1', 'a', '0', 1), resistor('R1', 'a', 'b', 1e3), diode('D1', 'b', '0')],
      nets: ['0', 'a', 'b'],
      params: {},
    };
    expect(rubberStamps(c, { ...c, elements: c.elements.filter((e) => e.name !== 'D1') })).toBeUndefined();
    expect(rubberStamps(c, { ...c, elements: [...c.elements, resistor('R9', 'b', 'new', 1)] })).toBeUndefined();
    expect(rubberStamps(c, { ...c, elements: c.elements.map((e) => (e.name === 'R1' ? { ...e, value: 2e3 } : e)) })).toEqual([
      { a: 'a', b: 'b', dg: -1e-3 },
      { a: 'a', b: 'b', dg: 0.5e-3 },
    ]);
  });
});
