// HAProxy from Debian's packages in front of the server processes, on loopback, for the scale-out run. It is
// installed here, when that run asks for it (as root), not by `npm test` or setup.
import { spawn, type ChildProcess } from 'node:child_process';
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { aptInstall, findFreePort, which } from '../lib/proc';
import { reportsDir, sleep } from './env';

export function ensureHaproxy(): void {
  if (!which('haproxy')) aptInstall(['haproxy'], 'the two-server load run puts HAProxy in front of the servers');
}

/**
 * Round robin over the servers, with a health check every 500 ms. A request whose server refused the
 * connection or closed it without an answer is sent to the other server: safe for reading writes because each
 * carries an idempotency key the server stores with the row (a repeat answers the stored reading), and possible
 * because the request body is buffered in the balancer.
 */
function config(port: number, servers: string[]): string {
  return [
    'global',
    '  maxconn 4096',
    'defaults',
    '  mode http',
    '  timeout connect 2s',
    '  timeout client 30s',
    '  timeout server 30s',
    '  option http-buffer-request',
    '  retries 3',
    '  retry-on conn-failure empty-response',
    '  option redispatch 1',
    'frontend api',
    `  bind 127.0.0.1:${port}`,
    '  default_backend servers',
    'backend servers',
    '  balance roundrobin',
    '  option httpchk GET /api/health',
    '  default-server inter 500 fall 2 rise 2',
    ...servers.map((url, i) => `  server s${i + 1} ${new URL(url).host} check`),
    '',
  ].join('\n');
}

export class Balancer {
  private constructor(
    readonly url: string,
    private readonly child: ChildProcess,
  ) {}

  static async start(servers: string[]): Promise<Balancer> {
    const port = await findFreePort(7400 + (process.pid % 400));
    const file = join(reportsDir, 'bench-load-haproxy.cfg');
    writeFileSync(file, config(port, servers));
    const child = spawn('haproxy', ['-f', file, '-db'], { stdio: ['ignore', 'inherit', 'inherit'] });
    const url = `http://127.0.0.1:${port}`;
    for (let i = 0; i < 100; i++) {
      if (child.exitCode !== null) throw new Error(`haproxy exited (${child.exitCode}); its configuration is ${file}`);
      const ok = await fetch(`${url}/api/health`, { signal: AbortSignal.timeout(1000) }).then(
        (r) => r.status < 500,
        () => false,
      );
      if (ok) return new Balancer(url, child);
      await sleep(100);
    }
    child.kill('SIGKILL');
    throw new Error('haproxy did not pass requests to a healthy server within 10 s');
  }

  async stop(): Promise<void> {
    if (this.child.exitCode !== null) return;
    const exited = new Promise((r) => this.child.once('exit', r));
    this.child.kill('SIGTERM');
    await Promise.race([exited, sleep(5000)]);
  }
}
