import { spawn, spawnSync, type SpawnSyncOptions } from 'node:child_process';
import { createServer } from 'node:net';

/** Thrown for a failure the user can act on: printed as one line, no stack trace. */
export class SetupError extends Error {}

export function sh(cmd: string, args: string[], opts: SpawnSyncOptions = {}): { status: number; stdout: string; stderr: string } {
  const r = spawnSync(cmd, args, { encoding: 'utf8', ...opts });
  if (r.error) return { status: 127, stdout: '', stderr: r.error.message };
  return { status: r.status ?? 1, stdout: String(r.stdout ?? ''), stderr: String(r.stderr ?? '') };
}

/** Runs a command with inherited output; resolves to its exit code. */
export function runInherit(cmd: string, args: string[], env: NodeJS.ProcessEnv = process.env, cwd?: string): Promise<number> {
  return new Promise((resolve) => {
    const child = spawn(cmd, args, { stdio: 'inherit', env, cwd });
    child.on('error', () => resolve(127));
    child.on('exit', (code, signal) => resolve(code ?? (signal ? 1 : 0)));
  });
}

export function which(bin: string): boolean {
  return sh('sh', ['-c', `command -v ${bin}`]).status === 0;
}

export const isRoot = () => typeof process.getuid === 'function' && process.getuid() === 0;

/** apt-get install, once per process after an update; only as root. */
let aptUpdated = false;
export function aptInstall(pkgs: string[], why: string): void {
  if (!isRoot()) throw new SetupError(`${why}: install the Debian packages ${pkgs.join(' ')} (needs root), then run again`);
  console.log(`splitscope: installing ${pkgs.join(' ')} from Debian's packages (${why})`);
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  if (!aptUpdated) {
    sh('apt-get', ['update', '-qq'], { env, stdio: 'ignore' });
    aptUpdated = true;
  }
  const r = sh('apt-get', ['install', '-y', '-qq', '--no-upgrade', ...pkgs], { env });
  if (r.status !== 0) throw new SetupError(`could not install ${pkgs.join(' ')}: ${r.stderr.trim().split('\n').pop()}`);
}

export function portIsFree(port: number): Promise<boolean> {
  return new Promise((resolve) => {
    const srv = createServer();
    srv.once('error', () => resolve(false));
    srv.listen(port, '127.0.0.1', () => srv.close(() => resolve(true)));
  });
}

export async function findFreePort(from: number): Promise<number> {
  for (let p = from; p < from + 200; p++) if (await portIsFree(p)) return p;
  throw new SetupError(`no free TCP port on 127.0.0.1 between ${from} and ${from + 199}`);
}

export async function waitForHttp(url: string, timeoutMs: number): Promise<void> {
  const end = Date.now() + timeoutMs;
  while (Date.now() < end) {
    try {
      const r = await fetch(url);
      if (r.ok) return;
    } catch {
      /* not up yet */
    }
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new SetupError(`the server did not answer ${url} within ${Math.round(timeoutMs / 1000)} s`);
}
