#!/usr/bin/env node
// Entry point for `npm start`, `npm test` and friends on a machine that has only Node.js and npm.
// It installs the pinned pnpm into ./.tools (no global install), installs the workspace, then hands
// over to the TypeScript task runner in scripts/tasks.ts.
import { spawnSync } from 'node:child_process';
import { existsSync, readFileSync, statSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const PNPM_VERSION = '12.4.2';
const toolsDir = join(root, '.tools');
const pnpmBin = join(toolsDir, 'node_modules', '.bin', 'pnpm');

function run(cmd, args, opts = {}) {
  const r = spawnSync(cmd, args, { cwd: root, stdio: 'inherit', ...opts });
  if (r.error) {
    console.error(`splitscope: could not run ${cmd}: ${r.error.message}`);
    process.exit(1);
  }
  return r.status ?? 1;
}

function installedPnpmVersion() {
  try {
    return JSON.parse(readFileSync(join(toolsDir, 'node_modules', 'pnpm', 'package.json'), 'utf8')).version;
  } catch {
    return null;
  }
}

if (installedPnpmVersion() !== PNPM_VERSION) {
  console.log(`splitscope: installing pnpm ${PNPM_VERSION} into .tools/`);
  const status = run('npm', ['install', '--prefix', toolsDir, '--no-save', '--no-audit', '--no-fund', '--loglevel=error', `pnpm@${PNPM_VERSION}`]);
  if (status !== 0) {
    console.error('splitscope: installing pnpm failed (is the npm registry reachable?)');
    process.exit(status);
  }
}

// Install dependencies only when the lockfile changed since the last install: a warm start stays fast.
const lock = join(root, 'pnpm-lock.yaml');
const marker = join(root, 'node_modules', '.modules.yaml');
const stale = !existsSync(marker) || (existsSync(lock) && statSync(lock).mtimeMs > statSync(marker).mtimeMs);
if (stale) {
  const args = ['install', '--reporter=append-only'];
  if (process.env.CI) args.push('--frozen-lockfile');
  const status = run(pnpmBin, args);
  if (status !== 0) {
    console.error('splitscope: dependency install failed');
    process.exit(status);
  }
}

const task = process.argv[2] ?? 'start';
// The bench-meter tests talk to a simulated SCPI meter over a pseudo-terminal pair made by Debian's socat: install
// it for `npm test` when missing (as root; otherwise those tests say why they skip).
const hasSocat = () => spawnSync('sh', ['-c', 'command -v socat'], { stdio: 'ignore' }).status === 0;
if (task === 'test' && !hasSocat() && process.getuid?.() === 0) {
  console.log("splitscope: installing socat from Debian's packages (the bench-meter tests need it)");
  const aptEnv = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  if (run('apt-get', ['install', '-y', '-qq', '--no-upgrade', 'socat'], { env: aptEnv }) !== 0) {
    run('apt-get', ['update', '-qq'], { env: aptEnv, stdio: 'ignore' });
    if (run('apt-get', ['install', '-y', '-qq', '--no-upgrade', 'socat'], { env: aptEnv }) !== 0)
      console.warn('splitscope: could not install socat; the bench-meter tests will skip');
  }
}
const tsx = join(root, 'node_modules', '.bin', 'tsx');
const env = { ...process.env, PATH: `${join(toolsDir, 'node_modules', '.bin')}:${join(root, 'node_modules', '.bin')}:${process.env.PATH}` };
process.exit(run(tsx, [join(root, 'scripts', 'tasks.ts'), task, ...process.argv.slice(3)], { env }));
