import { describe, expect, it } from 'vitest';
import { flatten, NetlistError, parseNetlist, parseSpiceNumber } from './index';

// Value syntax: Berkeley SPICE3 user's guide (T. Quarles, "SPICE3 Version 3f3 User's Manual", section 1.3 "Input
// format": scale factors f p n u m k meg g t mil, letters after a number that are not scale factors are ignored).
describe('SPICE numbers (SPICE3 user manual §1.3)', () => {
  it.each([
    ['1f', 1e-15],
    ['1p', 1e-12],
    ['1n', 1e-9],
    ['1u', 1e-6],
    ['1m', 1e-3],
    ['1M', 1e-3], // SPICE reads M as milli
    ['1k', 1e3],
    ['1meg', 1e6],
    ['2.2MEG', 2.2e6],
    ['1g', 1e9],
    ['1t', 1e12],
    ['10kohm', 1e4],
    ['1uF', 1e-6],
    ['4.7K', 4.7e3],
    ['1e3', 1e3],
    ['-2.5e-3V', -2.5e-3],
    ['.5', 0.5],
    ['10V', 10],
    ['25mil', 25 * 25.4e-6],
  ])('%s = %d', (tok, v) => {
    expect(Math.abs((parseSpiceNumber(tok) as number) - v)).toBeLessThanOrEqual(Math.abs(v) * 1e-12);
  });
  it('rejects non-numbers', () => {
    expect(parseSpiceNumber('abc')).toBeUndefined();
    expect(parseSpiceNumber('')).toBeUndefined();
  });
});

describe('netlist syntax (SPICE3 user manual §1.3: title line, * comments, + continuation; ngspice manual §2.1: ; and $ inline comments)', () => {
  const text = [
    'divider title line',
    '* a comment line',
    'V1 in 0 DC 15 ; inline comment',
    'R1 in',
    '+ out 10kohm $ another inline comment',
    'R2 out 0',
    '+ 4.7k',
    '.op',
    '.end',
    'R3 out 0 1 this is after .end and ignored',
  ].join('\n');
  it('parses title, comments, continuation lines and DC keyword', () => {
    const nl = parseNetlist(text);
    expect(nl.title).toBe('divider title line');
    expect(nl.elements.map((e) => e.name)).toEqual(['V1', 'R1', 'R2']);
    expect(nl.elements[1]?.nodes).toEqual(['in', 'out']);
    expect(nl.elements[1]?.value).toEqual({ kind: 'number', value: 1e4 });
    expect(nl.elements[2]?.value).toEqual({ kind: 'number', value: 4.7e3 });
    expect(nl.elements[0]?.value).toEqual({ kind: 'number', value: 15 });
    expect(nl.elements[1]?.line).toBe(4);
  });
  it('treats the first line as the title (SPICE3), or not when asked', () => {
    expect(parseNetlist('R1 a 0 1k\nV1 a 0 1').elements.map((e) => e.name)).toEqual(['V1']);
    expect(parseNetlist('R1 a 0 1k\nV1 a 0 1', { title: false }).elements.map((e) => e.name)).toEqual(['R1', 'V1']);
  });
  it('skips .control blocks and accepts models with parentheses and spaced "="', () => {
    const nl = parseNetlist('t\nD1 a 0 dm\nV1 a 0 1\n.model dm D ( IS = 1e-12 , N=2 )\n.control\nop\nprint all\n.endc\n.end');
    expect(nl.models.dm?.params.is).toEqual({ kind: 'number', value: 1e-12 });
    expect(nl.models.dm?.params.n).toEqual({ kind: 'number', value: 2 });
  });
  it('evaluates .param expressions with mathjs, SPICE suffixes inside braces and overrides', () => {
    const nl = parseNetlist('t\n.param RBASE=2k GAIN={RBASE/1k + 1}\n.param FAN_ON=1\nV1 a 0 {FAN_ON * 12}\nR1 a b {RBASE*gain}\nR2 b 0 {2.2k + 0.3k}\n');
    const c = flatten(nl);
    const r1 = c.elements.find((e) => e.name === 'R1');
    const r2 = c.elements.find((e) => e.name === 'R2');
    const v1 = c.elements.find((e) => e.name === 'V1');
    expect(r1 && 'value' in r1 ? r1.value : NaN).toBeCloseTo(6000, 9);
    expect(r2 && 'value' in r2 ? r2.value : NaN).toBeCloseTo(2500, 9);
    expect(v1 && 'value' in v1 ? v1.value : NaN).toBe(12);
    const off = flatten(nl, { FAN_ON: 0 });
    const v1off = off.elements.find((e) => e.name === 'V1');
    expect(v1off && 'value' in v1off ? v1off.value : NaN).toBe(0);
  });
  it('names subcircuit elements and nodes by instance path (nested)', () => {
    const nl = parseNetlist('t\n.subckt leg p q\nRa p m 1k\nRb m q 1k\n.ends\n.subckt pair x y\nXL1 x y leg\nXL2 x y leg\n.ends\nV1 a 0 1\nXP a 0 pair\n');
    const c = flatten(nl);
    expect(c.elements.map((e) => e.name)).toEqual(['V1', 'XP.XL1.Ra', 'XP.XL1.Rb', 'XP.XL2.Ra', 'XP.XL2.Rb']);
    expect(c.elements[1]?.part).toBe('XP');
    expect(c.elements[1]?.nodes).toEqual(['a', 'xp.xl1.m']);
    expect(c.nets).toContain('xp.xl2.m');
  });
  it('maps gnd to the reference node 0', () => {
    const c = flatten(parseNetlist('t\nV1 a GND 1\nR1 a gnd 1k'));
    expect(c.elements[0]?.nodes).toEqual(['a', '0']);
  });
});

describe('netlist errors name the line and say what is wrong', () => {
  const err = (text: string, params?: Record<string, number>): NetlistError => {
    try {
      flatten(parseNetlist(text), params);
    } catch (e) {
      expect(e).toBeInstanceOf(NetlistError);
      return e as NetlistError;
    }
    throw new Error('expected a NetlistError');
  };
  it('Q with too few nodes', () => {
    const e = err('t\nV1 a 0 1\nR1 a b 1k\nQ1 a b\n');
    expect(e.message).toBe('line 4: Q1 needs 3 nodes and a model name');
    expect(e.line).toBe(4);
  });
  it('unknown element letter', () => {
    expect(err('t\nV1 a 0 1\nZ1 a 0 1k').message).toMatch(/^line 3: unknown element "Z1"/);
  });
  it('missing model', () => {
    expect(err('t\nV1 a 0 1\nD1 a 0 nosuch').message).toBe('line 3: D1: model "nosuch" is not defined');
  });
  it('model of the wrong kind', () => {
    expect(err('t\nV1 a 0 1\nQ1 a a 0 dm\n.model dm D').message).toMatch(/^line 3: Q1: model "dm" is a diode model/);
  });
  it('node with no DC path to the reference in the netlist as written', () => {
    expect(err('t\nV1 a 0 1\nR1 a b 1k\nC1 b c 1u\nR2 c d 1k').message).toMatch(/^line 4: nodes c, d have no DC path to the reference/);
  });
  it('bad value', () => {
    expect(err('t\nR1 a 0 1k!').message).toMatch(/^line 2: R1: "1k!" is not a number/);
  });
  it('undefined parameter in an expression', () => {
    expect(err('t\nV1 a 0 1\nR1 a 0 {RX*2}').message).toMatch(/^line 3: R1: cannot evaluate \{RX\*2\}/);
  });
  it('unsupported command and source function', () => {
    expect(err('t\nV1 a 0 1\n.include other.lib').message).toMatch(/^line 3: unsupported command ".include"/);
    expect(err('t\nV1 a 0 AM 1 0 1k 10k').message).toMatch(/^line 2: V1: source function "AM" is not supported/);
  });
  it('subcircuit problems', () => {
    expect(err('t\nV1 a 0 1\nX1 a 0 nosub').message).toBe('line 3: X1: subcircuit "nosub" is not defined');
    expect(err('t\n.subckt s p q\nR1 p q 1\n.ends\nV1 a 0 1\nX1 a s').message).toMatch(/^line 6: X1: subcircuit s has 2 ports, 1 nodes given/);
    expect(err('t\n.subckt s p q\nR1 p q 1\n').message).toMatch(/^line 2: \.subckt s has no \.ends/);
    expect(err('t\n.ends').message).toBe('line 2: .ends without .subckt');
  });
  it('continuation with nothing before it and unbalanced braces', () => {
    expect(err('t\n+ 1k').message).toMatch(/^line 2: continuation line/);
    expect(err('t\nV1 a 0 1\nR1 a 0 {1k').message).toMatch(/^line 3: unbalanced/);
  });
  it('F/H with an unknown controlling source', () => {
    expect(err('t\nV1 a 0 1\nR1 a 0 1k\nF1 a 0 VX 2').message).toMatch(/^line 4: F1: controlling voltage source "vx" is not defined/);
  });
  it('duplicate element names', () => {
    expect(err('t\nV1 a 0 1\nR1 a 0 1k\nr1 a 0 2k').message).toBe('line 4: duplicate element name "r1"');
  });
});
