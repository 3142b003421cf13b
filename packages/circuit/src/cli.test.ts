import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { commands, main } from './cli';

const dir = mkdtempSync(join(tmpdir(), 'circuit-cli-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));
const file = (name: string, text: string) => {
  const p = join(dir, name);
  writeFileSync(p, text);
  return p;
};

const FAN = file('fan.cir', 'fan section (invented)\n.param FAN_ON=1\nVBUS p 0 {15*FAN_ON}\nR1 p vfan 1k\nR2 vfan 0 2k\nC2 vfan 0 10u\nC3 vfan 0 100n\n.end\n');

async function run(args: string[], entry: (argv: string[]) => Promise<number> = main): Promise<{ code: number; out: string; err: string }> {
  let out = '';
  let err = '';
  const o = vi.spyOn(process.stdout, 'write').mockImplementation((s) => ((out += String(s)), true));
  const e = vi.spyOn(process.stderr, 'write').mockImplementation((s) => ((err += String(s)), true));
  try {
    const code = await entry(args);
    return { code, out, err };
  } finally {
    o.mockRestore();
    e.mockRestore();
  }
}

describe('circuit CLI', () => {
  // the expression engine loads on the first netlist with expressions (a few seconds on a busy machine): load it
  // before the tests that use one, outside their time limit
  beforeAll(() => import('./mathjs-engine'), 60_000);
  it('op prints converged, node voltages and source currents (voltage division; SPICE sign for I(VBUS))', async () => {
    const r = await run(['op', FAN]);
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out) as { converged: boolean; nodes: Record<string, number>; sources: Record<string, number> };
    expect(j.converged).toBe(true);
    expect(j.nodes.vfan).toBeCloseTo(10, 12);
    expect(j.sources.vbus).toBeCloseTo(-5e-3, 15);
  });
  it('read ohm defaults to power off, with --lift and --param (series/parallel by hand)', async () => {
    const r = await run(['read', FAN, '--mode', 'ohm', '--red', 'vfan', '--black', '0', '--lift', 'C2,C3']);
    expect(r.code).toBe(0);
    expect(JSON.parse(r.out)).toEqual({ value: 2000, unit: 'ohm' });
    const lifted = await run(['read', FAN, '--mode', 'ohm', '--red', 'vfan', '--black', '0', '--lift', 'R2']);
    expect(JSON.parse(lifted.out)).toEqual({ value: 'OL', unit: 'ohm' });
    const dcv = await run(['read', FAN, '--mode', 'dcv', '--red', 'vfan', '--black', '0', '--param', 'FAN_ON=0']);
    expect(JSON.parse(dcv.out)).toEqual({ value: 0, unit: 'V' });
  });
  it('bad input exits 2 with one line and no stack trace', async () => {
    for (const args of [
      ['read', FAN, '--mode', 'ohm', '--red', 'nosuch', '--black', '0'],
      ['read', FAN, '--mode', 'ohm', '--red', 'vfan', '--black', '0', '--power', 'on'],
      ['read', FAN, '--mode', 'amps', '--red', 'vfan', '--black', '0'],
      ['read', FAN, '--mode', 'ohm', '--red', 'vfan'],
      ['op', join(dir, 'missing.cir')],
      ['op', file('bad.cir', 't\nV1 a 0 1\nQ1 a b\n')],
      ['op', FAN, '--bogus', '1'],
      ['frobnicate'],
      [],
    ]) {
      const r = await run(args);
      expect(r.code, args.join(' ')).toBe(2);
      expect(r.out).toBe('');
      expect(r.err.trim().split('\n')).toHaveLength(1);
      expect(r.err).not.toMatch(/\n\s+at /);
    }
    expect((await run(['op', file('bad2.cir', 't\nV1 a 0 1\nQ1 a b\n')])).err).toBe('line 3: Q1 needs 3 nodes and a model name\n');
  });
  it('has a commands map that further subcommands register in; diagnosis has its own command line', () => {
    expect(Object.keys(commands)).toEqual(expect.arrayContaining(['op', 'read']));
    expect(Object.keys(commands)).not.toContain('diagnose');
  });
  it('loads the expression engine (mathjs) only for a netlist with expressions', async () => {
    vi.resetModules();
    const cli = await import('./cli');
    const ex = await import('./expressions');
    const plain = await run(['op', file('plain.cir', 't\nV1 in 0 15\nR1 in out 10k\nR2 out 0 4.7k\n')], cli.main);
    expect(JSON.parse(plain.out).nodes.out).toBeCloseTo((15 * 4.7) / 14.7, 12);
    expect(() => ex.evalExpr('1+1', new Map(), 1, 'probe')).toThrow(ex.ExpressionEngineMissing);
    const fan = await run(['op', FAN], cli.main);
    expect(JSON.parse(fan.out).nodes.vfan).toBeCloseTo(10, 12);
    expect(ex.evalExpr('2*3k', new Map(), 1, 'probe')).toBe(6000);
  }, 60_000);
});
