/**
 * Operating points against ngspice (Debian package ngspice 39, `.op` + `print all`): committed expected values
 * in ngspice/expected.json always; live ngspice runs in addition when it is installed.
 * Acceptance: node voltages within max(1 mV, 0.1 %); branch currents within max(0.1 %, 1 nA).
 */
import { readdirSync, readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { ngspiceAvailable, ngspiceOp, type SpiceOp } from '../ngspice/ngspice';
import { flatten, parseNetlist, solveOp } from './index';

const dir = join(dirname(fileURLToPath(import.meta.url)), '..', 'ngspice');
const expected = JSON.parse(readFileSync(join(dir, 'expected.json'), 'utf8')) as { decks: Record<string, SpiceOp> };
const decks = readdirSync(join(dir, 'decks'))
  .filter((f) => f.endsWith('.cir'))
  .sort();

function compare(ours: ReturnType<typeof solveOp>, ref: SpiceOp) {
  expect(ours.converged, ours.message).toBe(true);
  for (const [node, v] of Object.entries(ref.nodes)) {
    const got = ours.nodes[node];
    expect(got, `node ${node}`).toBeTypeOf('number');
    expect(Math.abs((got as number) - v), `node ${node}: ours ${got} vs ngspice ${v}`).toBeLessThanOrEqual(Math.max(1e-3, 1e-3 * Math.abs(v)));
  }
  for (const [src, i] of Object.entries(ref.sources)) {
    const got = ours.sources[src];
    expect(got, `branch ${src}`).toBeTypeOf('number');
    expect(Math.abs((got as number) - i), `branch ${src}: ours ${got} vs ngspice ${i}`).toBeLessThanOrEqual(Math.max(1e-9, 1e-3 * Math.abs(i)));
  }
}

describe('operating points vs ngspice 39 (committed fixtures)', () => {
  it('has a fixture for every deck', () => {
    expect(Object.keys(expected.decks).sort()).toEqual(decks);
  });
  for (const f of decks) {
    it(`${f} matches ngspice .op within max(1 mV, 0.1 %)`, () => {
      const ref = expected.decks[f] as SpiceOp;
      const op = solveOp(flatten(parseNetlist(readFileSync(join(dir, 'decks', f), 'utf8'))));
      compare(op, ref);
    });
  }
});

describe.runIf(ngspiceAvailable())('operating points vs live ngspice', () => {
  for (const f of decks) {
    it(`${f} matches a live ngspice run`, () => {
      const text = readFileSync(join(dir, 'decks', f), 'utf8');
      compare(solveOp(flatten(parseNetlist(text))), ngspiceOp(text));
    });
  }
});
