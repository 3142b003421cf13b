// Runs ngspice (Debian's package, `ngspice -b`) on a deck and keeps its output under .data/ by the deck's hash, so a
// rerun of the bench only simulates decks it has not seen. The parser reads what the decks of deck.ts print:
// `print all` blocks after each `op` (one block per analysis, in order) and `meas` results of a transient run.
import { spawn, spawnSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';

const ROOT = join(import.meta.dirname, '..', '..', '..', '..');
const CACHE = join(ROOT, '.data', 'accuracy-ngspice');

export function ngspiceAvailable(): boolean {
  const r = spawnSync('ngspice', ['-v'], { encoding: 'utf8' });
  return r.status === 0 || /ngspice/i.test(String(r.stdout));
}

export class GroundTruthError extends Error {}

/** One `print all` block: node name (lower case, as ngspice prints it) → volts. */
export type OpBlock = Map<string, number>;

export interface SpiceResult {
  ops: OpBlock[];
  measures: Map<string, number>;
}

// ngspice starts in ~0.3 s of mostly waiting; two at a time keeps both cores busy with the diagnosis in between.
const MAX_RUNNING = 2;
let running = 0;
const waiting: (() => void)[] = [];

async function slot<T>(work: () => Promise<T>): Promise<T> {
  if (running >= MAX_RUNNING) await new Promise<void>((resolve) => waiting.push(resolve));
  running += 1;
  try {
    return await work();
  } finally {
    running -= 1;
    waiting.shift()?.();
  }
}

function runProcess(deck: string): Promise<string> {
  return new Promise((resolve, reject) => {
    const child = spawn('ngspice', ['-b'], { stdio: ['pipe', 'pipe', 'pipe'] });
    let out = '';
    child.stdout.on('data', (d: Buffer) => (out += d.toString()));
    child.stderr.on('data', (d: Buffer) => (out += d.toString()));
    child.on('error', reject);
    child.on('close', () => resolve(out));
    child.stdin.end(deck);
  });
}

export const stats = { runs: 0, cached: 0 };

export async function simulate(deck: string): Promise<SpiceResult> {
  const hash = createHash('sha256').update(deck).digest('hex').slice(0, 32);
  const file = join(CACHE, `${hash}.txt`);
  let out: string;
  if (existsSync(file)) {
    out = readFileSync(file, 'utf8');
    stats.cached += 1;
  } else {
    out = await slot(() => runProcess(deck));
    stats.runs += 1;
    if (!failed(out)) {
      mkdirSync(CACHE, { recursive: true });
      writeFileSync(file, out);
    }
  }
  if (failed(out)) throw new GroundTruthError(`ngspice could not solve the deck: ${failed(out)}`);
  return parseOutput(out);
}

function failed(out: string): string | undefined {
  const m = /(no convergence[^\n]*|singular matrix[^\n]*|timestep too small[^\n]*|error[^\n]*)/i.exec(out);
  return m ? m[1] : undefined;
}

export function parseOutput(out: string): SpiceResult {
  const ops: OpBlock[] = [];
  const measures = new Map<string, number>();
  let block: OpBlock | undefined;
  for (const line of out.split('\n')) {
    if (/^No\. of Data Rows/.test(line)) {
      block = new Map();
      ops.push(block);
      continue;
    }
    const meas = /^(m_[a-z0-9_]+)\s+=\s+([-+0-9.eE]+)/.exec(line.trim());
    if (meas?.[1] && meas[2]) {
      measures.set(meas[1], Number(meas[2]));
      continue;
    }
    const node = /^([^\s=]+) = ([-+0-9.eE]+)$/.exec(line.trim());
    if (node?.[1] && node[2] && block) block.set(node[1].toLowerCase(), Number(node[2]));
  }
  return { ops, measures };
}
