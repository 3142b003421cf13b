/**
 * Runs decks through ngspice (`ngspice -b`, DC operating point, `print all`) and reads the results back.
 * Used by the comparison tests (live when ngspice is installed), the fixture update script and the benchmark.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

export interface SpiceOp {
  nodes: Record<string, number>;
  /** Branch currents by element name (ngspice "v1#branch" → "v1"; "v.xu1.vs#branch" → "xu1.vs"). */
  sources: Record<string, number>;
}

let available: boolean | undefined;

export function ngspiceAvailable(): boolean {
  if (available === undefined) {
    const r = spawnSync('ngspice', ['-v'], { encoding: 'utf8' });
    available = r.status === 0 || /ngspice/i.test(`${r.stdout ?? ''}${r.stderr ?? ''}`);
    if (r.error) available = false;
  }
  return available;
}

export function ngspiceVersion(): string {
  const r = spawnSync('ngspice', ['-v'], { encoding: 'utf8' });
  const m = /ngspice-(\d+)/i.exec(`${r.stdout ?? ''}`);
  return m ? `ngspice-${m[1]}` : 'ngspice';
}

/** Removes the .end card and appends a control block that runs op and prints every vector. */
export function withOpControl(deck: string): string {
  const body = deck.replace(/^\s*\.end\s*$/gim, '').trimEnd();
  return `${body}\n.control\nop\nprint all\n.endc\n.end\n`;
}

/** Parses `print all` output of an op analysis. */
export function parsePrintAll(out: string): SpiceOp {
  const nodes: Record<string, number> = {};
  const sources: Record<string, number> = {};
  for (const line of out.split(/\r?\n/)) {
    const m = /^([\w.#:+-]+) = ([-+0-9.eE]+)$/.exec(line.trim());
    if (!m) continue;
    const name = (m[1] as string).toLowerCase();
    const v = Number(m[2]);
    if (name.endsWith('#branch')) {
      let el = name.slice(0, -'#branch'.length);
      const sub = /^[a-z]\.(.+)$/.exec(el);
      if (sub) el = sub[1] as string;
      sources[el] = v;
    } else nodes[name] = v;
  }
  return { nodes, sources };
}

/** Runs one deck in one ngspice process. */
export function ngspiceOp(deck: string): SpiceOp {
  const dir = mkdtempSync(join(tmpdir(), 'splitscope-ngspice-'));
  try {
    const file = join(dir, 'deck.cir');
    writeFileSync(file, withOpControl(deck));
    const r = spawnSync('ngspice', ['-b', file], { encoding: 'utf8' });
    if (r.status !== 0 && !/No\. of Data Rows/.test(r.stdout)) throw new Error(`ngspice failed: ${r.stderr}`);
    return parsePrintAll(r.stdout);
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
