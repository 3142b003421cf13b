// Two connected pseudo-terminals made by socat (Debian's `socat` package): one end for the bridge, as if it were
// the meter's serial port, the other for the simulator.
import { spawn, spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

export const hasSocat = (): boolean => spawnSync('sh', ['-c', 'command -v socat'], { stdio: 'ignore' }).status === 0;

export interface PtyPair {
  /** The bridge's end: give it to `--port`. */
  meterPort: string;
  /** The simulator's end. */
  simPort: string;
  close(): Promise<void>;
}

export async function openPtyPair(): Promise<PtyPair> {
  if (!hasSocat()) throw new Error('socat is not installed: apt-get install socat');
  const dir = mkdtempSync(join(tmpdir(), 'meter-pty-'));
  const meterPort = join(dir, 'meter');
  const simPort = join(dir, 'sim');
  const socat = spawn('socat', [`pty,raw,echo=0,link=${meterPort}`, `pty,raw,echo=0,link=${simPort}`], { stdio: ['ignore', 'ignore', 'pipe'] });
  let stderr = '';
  socat.stderr.on('data', (d: Buffer) => (stderr += d.toString()));
  const started = Date.now();
  while (!(existsSync(meterPort) && existsSync(simPort))) {
    if (socat.exitCode !== null || Date.now() - started > 5000) {
      socat.kill();
      throw new Error(`socat did not make the terminal pair: ${stderr.trim() || 'no answer in 5 s'}`);
    }
    await new Promise((r) => setTimeout(r, 20));
  }
  return {
    meterPort,
    simPort,
    close: async () => {
      if (socat.exitCode === null) {
        const exited = new Promise((r) => socat.once('exit', r));
        socat.kill();
        await exited;
      }
      rmSync(dir, { recursive: true, force: true });
    },
  };
}
