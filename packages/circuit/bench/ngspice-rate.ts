/**
 * ngspice throughput on a set of decks: ONE ngspice process sources each deck and repeats `op` on it. A run with one
 * `op` per deck is subtracted from a run with many, so process start-up, deck parsing and circuit set-up are not
 * counted; what remains is repeated DC operating points on an already set-up circuit, each from ngspice's own
 * initial junction guess.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { childCpuMs } from './timing';

/** Solves per second (CPU time of the ngspice process; wall time where the OS does not report it). */
export function ngspicePerSecond(decks: string[], minMs = 800): number {
  const dir = mkdtempSync(join(tmpdir(), 'splitscope-bench-'));
  try {
    const files = decks.map((d, i) => {
      const f = join(dir, `d${i}.cir`);
      writeFileSync(f, d.replace(/^\s*\.op\s*$/gim, ''));
      return f;
    });
    const run = (reps: number) => {
      const ctl = ['* bench driver', '.control', 'set noaskquit'];
      for (const f of files) ctl.push(`source ${f}`, `repeat ${reps}`, 'op', 'destroy all', 'end', 'remcirc');
      ctl.push('quit', '.endc', '');
      const driver = join(dir, `driver-${reps}.cir`);
      writeFileSync(driver, ctl.join('\n'));
      const c0 = childCpuMs();
      const t0 = performance.now();
      const p = spawnSync('ngspice', ['-b', driver], { encoding: 'utf8', maxBuffer: 1 << 28 });
      const wall = performance.now() - t0;
      const c1 = childCpuMs();
      if (p.status !== 0 && !/Doing analysis/.test(p.stdout)) throw new Error(`ngspice failed: ${p.stderr.slice(0, 400)}`);
      return c0 !== undefined && c1 !== undefined ? c1 - c0 : wall;
    };
    run(1); // warm the file cache
    const base = Math.min(run(1), run(1));
    // grow the repetitions until the difference is long enough for the clock's resolution (10 ms ticks)
    for (let reps = 20; ;) {
      const t = Math.min(run(reps + 1), run(reps + 1)) - base;
      if (t >= minMs || reps > 1e6) return (1000 * reps * decks.length) / Math.max(t, 1e-6);
      reps = t > 50 ? Math.ceil((reps * 1.2 * minMs) / t) : reps * 4;
    }
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
