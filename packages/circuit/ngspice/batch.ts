/**
 * Many decks through a few ngspice processes (`ngspice -b` driver script: `source` each deck, `op`, `print all`,
 * `destroy all`, `remcirc`), so a corpus of a thousand decks costs a few process start-ups instead of a thousand.
 * A deck whose `op` fails is reported as not converged (ngspice prints no "Data Rows" for it).
 */
import { spawn } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { parsePrintAll, type SpiceOp } from './ngspice';

export interface BatchResult extends SpiceOp {
  converged: boolean;
}

function runDriver(driver: string): Promise<string> {
  return new Promise((resolve, reject) => {
    const p = spawn('ngspice', ['-b', driver], { stdio: ['ignore', 'pipe', 'pipe'] });
    const out: Buffer[] = [];
    p.stdout.on('data', (b: Buffer) => out.push(b));
    p.stderr.resume();
    p.on('error', reject);
    p.on('close', () => resolve(Buffer.concat(out).toString('utf8')));
  });
}

function parseSegments(text: string, into: Map<number, BatchResult>): void {
  const parts = text.split('@@begin ');
  for (const part of parts.slice(1)) {
    const nl = part.indexOf('\n');
    const id = Number(part.slice(0, nl).trim());
    const end = part.indexOf('@@end');
    const body = part.slice(nl + 1, end < 0 ? undefined : end);
    const ok = /No\. of Data Rows : 1/.test(body) && end >= 0;
    into.set(id, { converged: ok, ...(ok ? parsePrintAll(body) : { nodes: {}, sources: {} }) });
  }
}

/**
 * ngspice options for a reference solution: its default RELTOL 1e-3 lets a node that is held only by leakage stop
 * 0.1 % away from the solution (as much as the comparison allows), so references are solved a thousand times tighter.
 */
export const TIGHT_OPTIONS = '.options reltol=1e-6 vntol=1e-9 abstol=1e-15';

/** Runs `decks` through `processes` parallel ngspice processes; results in the order of the decks. */
export async function ngspiceBatch(decks: readonly string[], processes = 2, options = TIGHT_OPTIONS): Promise<BatchResult[]> {
  const dir = mkdtempSync(join(tmpdir(), 'splitscope-batch-'));
  try {
    const files = decks.map((d, i) => {
      const f = join(dir, `d${i}.cir`);
      writeFileSync(f, d.replace(/^\s*\.(op|end)\s*$/gim, '').trimEnd() + `\n${options}\n.end\n`);
      return f;
    });
    const drivers: string[] = [];
    for (let p = 0; p < processes; p++) {
      const ctl = ['* batch driver', '.control', 'set noaskquit'];
      for (let i = p; i < files.length; i += processes) {
        ctl.push(`echo @@begin ${i}`, `source ${files[i] as string}`, 'op', 'print all', 'echo @@end', 'destroy all', 'remcirc');
      }
      ctl.push('quit', '.endc', '');
      const driver = join(dir, `driver-${p}.cir`);
      writeFileSync(driver, ctl.join('\n'));
      drivers.push(driver);
    }
    const outs = await Promise.all(drivers.map(runDriver));
    const results = new Map<number, BatchResult>();
    for (const o of outs) parseSegments(o, results);
    return decks.map((_, i) => results.get(i) ?? { converged: false, nodes: {}, sources: {} });
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
