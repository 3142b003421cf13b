/**
 * CPU-time clocks for the benchmark. The machine it runs on is often shared, so throughput is computed from CPU time
 * (ours from process.cpuUsage, ngspice's from the children's times the kernel reports) rather than wall time, which
 * other processes' load would inflate on one side only.
 */
import { spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';

/** CPU time of this process, ms (user + system). */
export function cpuMs(): number {
  const u = process.cpuUsage();
  return (u.user + u.system) / 1000;
}

let ticksPerSecond: number | undefined;

/** CPU time of waited-for child processes, ms (Linux /proc/self/stat cutime + cstime); undefined elsewhere. */
export function childCpuMs(): number | undefined {
  try {
    const stat = readFileSync('/proc/self/stat', 'utf8');
    const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
    // fields[0] is field 3 (state) of proc(5); cutime and cstime are fields 16 and 17
    const ticks = Number(fields[13]) + Number(fields[14]);
    if (ticksPerSecond === undefined) ticksPerSecond = Number(spawnSync('getconf', ['CLK_TCK'], { encoding: 'utf8' }).stdout.trim()) || 100;
    return Number.isFinite(ticks) ? (1000 * ticks) / ticksPerSecond : undefined;
  } catch {
    return undefined;
  }
}

/**
 * Milliseconds of CPU per call of fn. Warms up for `warmMs` (so the optimising compiler's own threads, which count
 * in this process's CPU time, are mostly done), then takes the best of `rounds` rounds of `minMs` each: the least
 * disturbed round is the closest to the code's own cost on a shared machine.
 */
export function timeIt(fn: () => void, minMs = 300, rounds = 3, warmMs = 200): number {
  const w0 = cpuMs();
  while (cpuMs() - w0 < warmMs) fn();
  let best = Infinity;
  for (let r = 0; r < rounds; r++) {
    let n = 0;
    const t0 = cpuMs();
    let t = t0;
    while (t - t0 < minMs) {
      fn();
      n++;
      t = cpuMs();
    }
    best = Math.min(best, (t - t0) / n);
  }
  return best;
}
