// `npm start` must fail with one clear line when PostgreSQL cannot start (issue: foundation, "Must show").
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync, chmodSync } from 'node:fs';
import { createServer, type Server } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';

const root = join(import.meta.dirname, '..', '..');
const dirs: string[] = [];
afterAll(() => dirs.forEach((d) => rmSync(d, { recursive: true, force: true })));

function setup(env: Record<string, string>) {
  const r = spawnSync(join(root, 'node_modules', '.bin', 'tsx'), [join(root, 'scripts', 'tasks.ts'), 'setup'], {
    cwd: root,
    env: { ...process.env, ...env },
    encoding: 'utf8',
    timeout: 60_000,
  });
  return { status: r.status, lines: (r.stdout + r.stderr).trim().split('\n').filter(Boolean) };
}

function tempDir() {
  const d = mkdtempSync(join(tmpdir(), 'splitscope-setup-'));
  chmodSync(d, 0o777);
  dirs.push(d);
  return d;
}

describe('database start-up failures are one clear line', () => {
  it('a data folder that is not a PostgreSQL cluster', () => {
    const dir = tempDir();
    writeFileSync(join(dir, 'notes.txt'), 'not a cluster');
    const r = setup({ SPLITSCOPE_PG_DIR: dir, SPLITSCOPE_PG_PORT: '54398' });
    expect(r.status).not.toBe(0);
    expect(r.lines).toEqual([
      `splitscope: PostgreSQL cannot start: ${dir} exists but is not a PostgreSQL data folder (move it away, or set SPLITSCOPE_PG_DIR)`,
    ]);
  });

  it('a port that another program holds', async () => {
    const blocker: Server = createServer();
    const port = await new Promise<number>((resolve) => blocker.listen(0, '127.0.0.1', () => resolve((blocker.address() as { port: number }).port)));
    try {
      const r = setup({ SPLITSCOPE_PG_DIR: join(tempDir(), 'pg'), SPLITSCOPE_PG_PORT: String(port) });
      expect(r.status).not.toBe(0);
      const last = r.lines.at(-1);
      expect(last).toBe(
        `splitscope: PostgreSQL cannot start: port ${port} on 127.0.0.1 is already taken by another program (set SPLITSCOPE_PG_PORT to a free port)`,
      );
      expect(r.lines.join('\n')).not.toMatch(/\n\s+at /); // no stack trace
    } finally {
      blocker.close();
    }
  });
});
