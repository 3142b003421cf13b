import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { cloneCircuit, flatten, parseNetlist, resistor, solveOp, type Circuit } from './index';
import { clearTopologyCache, TOPOLOGY_CACHE_SIZE, topologyOf } from './structure-cache';

const divider = (r2: number): Circuit => flatten(parseNetlist(`divider\nV1 in 0 10\nR1 in out 1k\nR2 out 0 ${r2}\n`));
const fanDrive = () => flatten(parseNetlist(readFileSync(new URL('../ngspice/decks/fan-drive-section.cir', import.meta.url), 'utf8')));

describe('compiled topology cache', () => {
  it('reuses one compiled system for circuits of the same structure and stamps each one’s values (voltage division)', () => {
    const a = divider(1e3);
    const b = divider(3e3);
    expect(topologyOf(b, [])).toBe(topologyOf(a, []));
    expect(solveOp(a).nodes.out).toBeCloseTo(5, 12);
    expect(solveOp(b).nodes.out).toBeCloseTo(7.5, 12);
  });

  it('picks up a value edited in place after a solve (values are never cached)', () => {
    const c = divider(1e3);
    expect(solveOp(c).nodes.out).toBeCloseTo(5, 12);
    const r2 = c.elements.find((e) => e.name === 'R2');
    if (r2?.kind !== 'R') throw new Error('R2 missing');
    r2.value = 9e3;
    expect(solveOp(c).nodes.out).toBeCloseTo(9, 12);
  });

  it('compiles a new system when the structure changes (an added element, a probe net)', () => {
    const c = divider(1e3);
    const loaded = { ...c, elements: [...c.elements, resistor('RL', 'out', '0', 1e3)] };
    expect(topologyOf(loaded, [])).not.toBe(topologyOf(c, []));
    expect(topologyOf(c, ['pad'])).not.toBe(topologyOf(c, []));
    expect(solveOp(loaded).nodes.out).toBeCloseTo(10 / 3, 12);
  });

  it('gives a fresh copy of a board the same results as the original', () => {
    const board = fanDrive();
    const first = solveOp(board);
    const copy = solveOp(cloneCircuit(board));
    expect(copy.converged).toBe(true);
    for (const [node, v] of Object.entries(first.nodes)) expect(copy.nodes[node]).toBe(v);
  });

  it('factors the fan-drive section on the sparse path only: twin rows give every voltage-source branch a ±1 pivot', () => {
    const board = fanDrive();
    const top = topologyOf(board, []);
    top.work.denseFallbacks = 0;
    expect(solveOp(board).converged).toBe(true);
    expect(top.work.denseFallbacks).toBe(0);
  });

  it(`keeps at most ${TOPOLOGY_CACHE_SIZE} topologies, dropping the least recently used`, () => {
    clearTopologyCache();
    // a probe pad is part of the structure, so each pad name makes a distinct (small) topology
    const c = divider(1e3);
    const kept = topologyOf(c, ['pad0']);
    for (let k = 1; k <= TOPOLOGY_CACHE_SIZE; k++) topologyOf(c, [`pad${k}`]);
    expect(topologyOf(c, ['pad0'])).not.toBe(kept);
    const recent = topologyOf(c, [`pad${TOPOLOGY_CACHE_SIZE}`]);
    expect(topologyOf(c, [`pad${TOPOLOGY_CACHE_SIZE}`])).toBe(recent);
  });
});
