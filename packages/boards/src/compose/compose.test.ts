import { readFileSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { boardModelSchema } from '@splitscope/contract';
import { describe, expect, it } from 'vitest';
import { INDOOR_FAN_BOARD, INDOOR_FAN_SPEC } from '../demo/indoor-fan';
import { OUTDOOR_FAN_BOARD } from '../demo/outdoor-fan';
import { composeBoard, drawBoard } from './compose';
import type { BoardSpec } from './types';

const small: BoardSpec = {
  id: 'test-small',
  slug: 'test-small',
  name: 'Test board',
  family: 'Tests',
  maker: 'Invented',
  width: 600,
  height: 400,
  sections: [
    { id: 'reg15', template: 'regulator-15v', base: 200, nets: { out: 'v15' }, region: { x: 20, y: 20, w: 360, h: 200 } },
    { id: 'reg5', template: 'regulator-5v', base: 250, region: { x: 20, y: 220, w: 360, h: 160 } },
  ],
};

describe('composeBoard', () => {
  it('produces a document that passes the board-model schema, with a title line the parser drops', () => {
    const b = composeBoard(small);
    expect(boardModelSchema.safeParse(b).success).toBe(true);
    expect(b.netlist.split('\n')[0]).toMatch(/^\* Test board/);
    expect(b.netlist.trimEnd().endsWith('.end')).toBe(true);
    expect(b.sections.map((s) => [s.id, s.template, s.side])).toEqual([
      ['reg15', 'regulator-15v', 'hot'],
      ['reg5', 'regulator-5v', 'cold'],
    ]);
  });

  it('gives the cold ground a DC path to bus negative through the isolation resistor, only when it is used', () => {
    expect(composeBoard(small).netlist).toMatch(/^RISO gnd_c 0 22meg$/m);
    expect(OUTDOOR_FAN_BOARD.netlist).not.toMatch(/RISO/);
  });

  it('suggests test points from the templates with their reference nets and sourced bands', () => {
    const b = composeBoard(small);
    expect(b.testPoints.map((t) => [t.id, t.net, t.reference])).toEqual([
      ['TP1', 'reg15_vin', '0'],
      ['TP2', 'v15', '0'],
      ['TP3', 'reg5_vin', 'gnd_c'],
      ['TP4', 'vcc5_c', 'gnd_c'],
    ]);
    expect(b.testPoints[1]!.band?.source).toMatch(/MC7800/);
    // Hot points carry the bus caution; cold ones do not.
    expect(b.testPoints.map((t) => t.touchesBus)).toEqual([true, true, false, false]);
    expect(b.nets.find((n) => n.name === 'v15')).toMatchObject({ label: '15 V rail', side: 'hot', reference: '0' });
  });

  it('names what is wrong with a spec', () => {
    expect(() => composeBoard({ ...small, sections: [{ ...small.sections[0]!, template: 'nope' } as never] })).toThrow(/unknown template "nope"/);
    expect(() =>
      composeBoard({ ...small, sections: [small.sections[0]!, { ...small.sections[1]!, base: 200, template: 'regulator-15v', id: 'x' } as never] }),
    ).toThrow(/designator D201 is used twice/);
    expect(() => composeBoard({ ...small, testPoints: [{ id: 'TP1', net: 'nowhere' }] })).toThrow(/no part on net "nowhere"/);
  });

  it('places parts inside their section and draws them with designators, copper and connector pin labels', () => {
    for (const p of INDOOR_FAN_BOARD.parts) {
      const r = INDOOR_FAN_SPEC.sections.find((s) => s.id === p.section)!.region;
      expect(p.x, p.designator).toBeGreaterThan(r.x);
      expect(p.x, p.designator).toBeLessThan(r.x + r.w);
      expect(p.y, p.designator).toBeLessThan(r.y + r.h);
    }
    const svg = drawBoard(INDOOR_FAN_SPEC);
    for (const d of ['R405', 'R406', 'XU201'.slice(1), 'PC301', 'Q401']) expect(svg).toContain(`>${d}<`);
    expect(svg).toContain('>Speed command<');
    expect(svg.match(/<path d="M[^"]*" fill="none" stroke="#c8924a"/g)?.length).toBeGreaterThan(40);
  });
});

describe('the outdoor demo board keeps its circuit and ids', () => {
  it('has the twelve test points on the nets the demo jobs and the diagnosis tests use', () => {
    expect(OUTDOOR_FAN_BOARD.testPoints.map((t) => `${t.id}:${t.net}`).join(' ')).toBe(
      'TP1:bus TP2:aux1 TP3:v15 TP4:v5 TP5:vfan TP6:b1 TP7:oc TP8:la TP9:vsp TP10:fbc TP11:th1 TP12:rl',
    );
    expect(OUTDOOR_FAN_BOARD.parts).toHaveLength(61);
    expect(OUTDOOR_FAN_BOARD.parts.find((p) => p.designator === 'XVREG')?.kind).toBe('regulator');
    expect(OUTDOOR_FAN_BOARD.parts.find((p) => p.designator === 'RLOAD')).toBeUndefined();
  });
});

describe('the package index stays free of the circuit engine and mathjs', () => {
  // The board editor composes in the browser: nothing the index reaches may import the expression evaluator.
  const src = dirname(fileURLToPath(import.meta.url));
  const seen = new Set<string>();
  const walk = (file: string): string[] => {
    if (seen.has(file)) return [];
    seen.add(file);
    const text = readFileSync(file, 'utf8');
    const specs = [...text.matchAll(/from '([^']+)'/g)].map((m) => m[1]!);
    return specs.flatMap((s) => {
      if (!s.startsWith('.')) return [s];
      const base = resolve(dirname(file), s);
      for (const f of [`${base}.ts`, join(base, 'index.ts')]) {
        try {
          readFileSync(f);
          return walk(f);
        } catch {
          /* try the next form */
        }
      }
      return [];
    });
  };
  it('imports only the contract and zod from outside the package', () => {
    const external = new Set(walk(join(src, '..', 'index.ts')));
    expect([...external].sort()).toEqual(['@splitscope/contract']);
  });
});
