/**
 * The dictionary build beside ngspice (Debian's package, `ngspice -b`): the same faults on the same tests, each
 * re-solved from scratch by ngspice in ONE process (a driver that sources every deck, runs `op` and removes the
 * circuit), against our fast build (fast-predict.ts) of the same (fault, test) pairs.
 *
 * A deck is the faulted board in the test's state with the meter attached as circuit elements in the function /
 * range our meter ended its reading on (one `op` per reading: a reading our autoranging meter takes in two solves
 * counts once for ngspice, which favours ngspice). ngspice's time is the CPU time of its process (the kernel's
 * children times) less that of a driver that does nothing (process start-up): re-solving a faulted board from
 * scratch is loading its deck and solving it. Printed apart: the `op` alone (less a driver that loads the decks
 * without solving them), a lower bound that no re-solve from scratch reaches. Ours is this process's CPU time. CPU
 * time, since the machine is shared and wall time would carry other processes' load.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { measureDetailed, solveNodes, type Circuit, type Element } from '@splitscope/circuit';
import { applyFaults, type SubFault } from '../src/index';
import { FastPredictor } from '../src/electrical/fast-predict';
import type { ElectricalModel, ElectricalTest } from '../src/electrical/model';

export function ngspiceInstalled(): boolean {
  return spawnSync('ngspice', ['-v'], { encoding: 'utf8' }).status === 0;
}

const num = (x: number) => x.toPrecision(12);

/** A flat circuit as a SPICE deck: elements renamed by kind and index, nets made SPICE-safe, one .model each. */
export function spiceDeck(c: Circuit): string {
  const nets = new Map<string, string>([['0', '0']]);
  const net = (n: string) => {
    let s = nets.get(n);
    if (!s) nets.set(n, (s = `n${nets.size}`));
    return s;
  };
  const names = new Map<string, string>();
  c.elements.forEach((e, i) => names.set(e.name, `${e.kind}${i}`));
  const lines = ['* dictionary side-by-side deck'];
  c.elements.forEach((e: Element, i) => {
    const nm = names.get(e.name) as string;
    const ns = e.nodes.map(net).join(' ');
    switch (e.kind) {
      case 'R':
      case 'C':
      case 'L':
      case 'V':
      case 'I':
        lines.push(`${nm} ${ns} ${e.kind === 'V' || e.kind === 'I' ? 'DC ' : ''}${num(e.value)}`);
        break;
      case 'E':
      case 'G':
        lines.push(`${nm} ${ns} ${num(e.gain)}`);
        break;
      case 'F':
      case 'H':
        lines.push(`${nm} ${ns} ${names.get(e.control) ?? e.control} ${num(e.gain)}`);
        break;
      case 'D': {
        const m = e.model;
        const bv = Number.isFinite(m.bv) ? ` BV=${num(m.bv)} IBV=${num(m.ibv)}` : '';
        lines.push(`${nm} ${ns} M${i} ${num(e.area)}`, `.model M${i} D(IS=${num(m.is)} N=${num(m.n)} RS=${num(m.rs)}${bv})`);
        break;
      }
      case 'Q': {
        const m = e.model;
        const opt = (k: string, v: number) => (Number.isFinite(v) ? ` ${k}=${num(v)}` : '');
        const params =
          `IS=${num(m.is)} BF=${num(m.bf)} BR=${num(m.br)} NF=${num(m.nf)} NR=${num(m.nr)} RB=${num(m.rb)} RC=${num(m.rc)} RE=${num(m.re)}` +
          `${opt('VAF', m.vaf)}${opt('VAR', m.var)}${opt('IKF', m.ikf)}${opt('IKR', m.ikr)} NKF=${num(m.nkf)} ISE=${num(m.ise)} NE=${num(m.ne)}` +
          ` ISC=${num(m.isc)} NC=${num(m.nc)}${opt('RBM', m.rbm)}${opt('IRB', m.irb)}`;
        lines.push(`${nm} ${ns} M${i} ${num(e.area)}`, `.model M${i} ${m.type.toUpperCase()}(${params})`);
        break;
      }
    }
  });
  lines.push('.end', '');
  return lines.join('\n');
}

/** The faulted board in the test's state with the meter of the reading's last solve attached (undefined: no solve). */
function readingCircuit(model: ElectricalModel, f: SubFault, t: ElectricalTest): Circuit | undefined {
  const c = applyFaults(model.stateCircuit(t), [f], model.partsByName);
  let last: Circuit | undefined;
  try {
    measureDetailed(c, t, model.meter, {
      attach: (extra, red, black) => {
        last = { ...c, elements: [...c.elements, ...extra] };
        return solveNodes(last, { extraNodes: [red, black] });
      },
    });
  } catch {
    // a reading that does not solve is still a deck ngspice is asked to solve
  }
  return last;
}

function childCpuMs(): number {
  const stat = readFileSync('/proc/self/stat', 'utf8');
  const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
  // cutime and cstime (proc(5) fields 16 and 17), in clock ticks
  const hz = Number(spawnSync('getconf', ['CLK_TCK'], { encoding: 'utf8' }).stdout.trim()) || 100;
  return (1000 * (Number(fields[13]) + Number(fields[14]))) / hz;
}

/** CPU ms of one ngspice process sourcing every deck, with or without an `op` each. */
function ngspiceRun(dir: string, files: string[], op: boolean): number {
  const ctl = ['* side-by-side driver', '.control', 'set noaskquit'];
  for (const f of files) ctl.push(`source ${f}`, ...(op ? ['op'] : []), 'destroy all', 'remcirc');
  ctl.push('quit', '.endc', '');
  const driver = join(dir, `driver-${files.length}-${op ? 'op' : 'load'}.cir`);
  writeFileSync(driver, ctl.join('\n'));
  const c0 = childCpuMs();
  const p = spawnSync('ngspice', ['-b', driver], { encoding: 'utf8', maxBuffer: 1 << 30 });
  if (p.status !== 0 && !/Doing analysis|Circuit:/.test(p.stdout)) throw new Error(`ngspice failed: ${p.stderr.slice(0, 400)}`);
  return childCpuMs() - c0;
}

export interface SideBySide {
  pairs: number;
  oursMs: number;
  /** Loading and solving each deck (process start-up subtracted). */
  ngspiceMs: number;
  /** The `op` alone (loading subtracted). */
  ngspiceOpMs: number;
}

/** Our fast predictions and ngspice's solves from scratch of the same (fault, test) pairs. */
export function sideBySide(model: ElectricalModel, faults: readonly SubFault[], tests: readonly ElectricalTest[]): SideBySide {
  const u0 = process.cpuUsage();
  const fast = new FastPredictor(model);
  for (const f of faults) fast.predict([f], tests);
  const u = process.cpuUsage(u0);
  const oursMs = (u.user + u.system) / 1000;
  const dir = mkdtempSync(join(tmpdir(), 'splitscope-side-'));
  try {
    const files: string[] = [];
    for (const f of faults) {
      for (const t of tests) {
        const c = readingCircuit(model, f, t);
        if (!c) continue;
        const file = join(dir, `d${files.length}.cir`);
        writeFileSync(file, spiceDeck(c));
        files.push(file);
      }
    }
    ngspiceRun(dir, files.slice(0, 1), false); // the file cache, once
    const start = Math.min(ngspiceRun(dir, [], false), ngspiceRun(dir, [], false));
    const solved = ngspiceRun(dir, files, true);
    const loaded = ngspiceRun(dir, files, false);
    return { pairs: files.length, oursMs, ngspiceMs: solved - start, ngspiceOpMs: Math.max(0, solved - loaded) };
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
