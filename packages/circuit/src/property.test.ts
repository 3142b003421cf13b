/**
 * Property tests (fast-check): Kirchhoff's current law (Alexander & Sadiku §2.4) at every node of random resistor
 * networks, and the linearity/scaling of resistance (Ohm's law: scaling every R by k scales every driving-point
 * resistance by k).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { measure, resistor, isource, solveOp, type Circuit, type Element } from './index';

interface Net {
  nodes: number;
  edges: { a: number; b: number; r: number }[];
  injections: { node: number; amps: number }[];
}

const netArb: fc.Arbitrary<Net> = fc
  .integer({ min: 2, max: 12 })
  .chain((nodes) =>
    fc.record({
      nodes: fc.constant(nodes),
      // a spanning tree keeps every node connected to the reference (node 0)
      tree: fc.tuple(...Array.from({ length: nodes - 1 }, (_, i) => fc.tuple(fc.integer({ min: 0, max: i }), fc.double({ min: 1, max: 1e4, noNaN: true })))),
      extra: fc.array(fc.tuple(fc.integer({ min: 0, max: nodes - 1 }), fc.integer({ min: 0, max: nodes - 1 }), fc.double({ min: 1, max: 1e4, noNaN: true })), {
        maxLength: 20,
      }),
      injections: fc.array(fc.record({ node: fc.integer({ min: 1, max: nodes - 1 }), amps: fc.double({ min: -1, max: 1, noNaN: true }) }), {
        minLength: 1,
        maxLength: 5,
      }),
    }),
  )
  .map(({ nodes, tree, extra, injections }) => ({
    nodes,
    edges: [...tree.map(([a, r], i) => ({ a, b: i + 1, r })), ...extra.filter(([a, b]) => a !== b).map(([a, b, r]) => ({ a, b, r }))],
    injections,
  }));

const name = (i: number) => (i === 0 ? '0' : `n${i}`);

function toCircuit(net: Net, scale = 1, withSources = true): Circuit {
  const elements: Element[] = net.edges.map((e, i) => resistor(`R${i}`, name(e.a), name(e.b), e.r * scale));
  if (withSources) net.injections.forEach((inj, i) => elements.push(isource(`I${i}`, '0', name(inj.node), inj.amps)));
  return { title: 'random', elements, nets: Array.from({ length: net.nodes }, (_, i) => name(i)), params: {} };
}

describe('random resistor networks', () => {
  it('node voltages satisfy KCL at every node to 1e-9 relative', () => {
    fc.assert(
      fc.property(netArb, (net) => {
        const c = toCircuit(net);
        const op = solveOp(c);
        expect(op.converged).toBe(true);
        const v = (i: number) => (i === 0 ? 0 : (op.nodes[name(i)] ?? 0));
        // relative to the node's own current magnitude, floored at the largest current in the network
        let imax = 0;
        for (const e of net.edges) imax = Math.max(imax, Math.abs((v(e.a) - v(e.b)) / e.r));
        for (const inj of net.injections) imax = Math.max(imax, Math.abs(inj.amps));
        for (let k = 1; k < net.nodes; k++) {
          let sum = 0;
          let mag = 0;
          for (const e of net.edges) {
            const i = (v(e.a) - v(e.b)) / e.r; // current a → b
            if (e.a === k) {
              sum -= i;
              mag += Math.abs(i);
            }
            if (e.b === k) {
              sum += i;
              mag += Math.abs(i);
            }
          }
          for (const inj of net.injections) {
            if (inj.node === k) {
              sum += inj.amps;
              mag += Math.abs(inj.amps);
            }
          }
          expect(Math.abs(sum)).toBeLessThanOrEqual(1e-9 * Math.max(mag, imax, 1e-15));
        }
      }),
      { numRuns: 200 },
    );
  });

  it('scaling every resistance by k scales the ohm reading by k', () => {
    fc.assert(
      fc.property(netArb, fc.double({ min: 0.01, max: 100, noNaN: true }), fc.integer({ min: 1, max: 11 }), (net, k, probe) => {
        const red = name(probe % net.nodes === 0 ? 1 : probe % net.nodes);
        const base = measure(toCircuit(net, 1, false), { mode: 'ohm', red, black: '0' }).value;
        const scaled = measure(toCircuit(net, k, false), { mode: 'ohm', red, black: '0' }).value;
        expect(typeof base).toBe('number');
        expect(typeof scaled).toBe('number');
        expect(Math.abs((scaled as number) - k * (base as number))).toBeLessThanOrEqual(1e-9 * k * (base as number));
      }),
      { numRuns: 200 },
    );
  });
});
