import { fileURLToPath } from 'node:url';
import { describe, expect, it, vi } from 'vitest';
import { main } from './cli';

const example = (name: string) => fileURLToPath(new URL(`../examples/${name}`, import.meta.url));

function run(args: string[]): { code: number; out: string; err: string } {
  let out = '';
  let err = '';
  const o = vi.spyOn(process.stdout, 'write').mockImplementation((s) => ((out += String(s)), true));
  const e = vi.spyOn(process.stderr, 'write').mockImplementation((s) => ((err += String(s)), true));
  try {
    return { code: main(args), out, err };
  } finally {
    o.mockRestore();
    e.mockRestore();
  }
}

describe('diagnose command line', () => {
  it('prints the diagnosis of a case as JSON: the readings with their verdicts, the top candidates, the next tests', () => {
    const r = run([example('fan-dead-rail.json'), '--top', '2', '--next', '1']);
    expect(r.code, r.err).toBe(0);
    const j = JSON.parse(r.out) as { readings: { verdict: string }[]; candidates: unknown[]; nextTests: unknown[] };
    expect(j.readings.map((x) => x.verdict)).toEqual(['ok', 'low', 'low']);
    expect(j.candidates).toHaveLength(2);
    expect(j.nextTests.length).toBeLessThanOrEqual(1);
  }, 60_000);

  it('bad input exits 2 with one line naming the problem (a bad case names its reading)', () => {
    for (const [args, message] of [
      [[example('bad-net.json')], /^reading 3: unknown net vfna\n$/],
      [[], /^usage: diagnose CASE\.json/],
      [['a.json', 'b.json'], /^usage: diagnose CASE\.json/],
      [['a.json', '--top', '0'], /^--top expects a positive whole number, got "0"\n$/],
      [['a.json', '--bogus', '1'], /^Unknown option '--bogus'/],
      [['no-such-case.json'], /^cannot read no-such-case\.json\n$/],
    ] as const) {
      const r = run([...args]);
      expect(r.code, args.join(' ')).toBe(2);
      expect(r.out).toBe('');
      expect(r.err).toMatch(message);
      expect(r.err.trim().split('\n')).toHaveLength(1);
    }
  });
});
