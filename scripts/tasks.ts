// The project's task runner, reached through scripts/bootstrap.mjs (`npm start`, `npm test`, ...).
import { existsSync, mkdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { loadDotEnv } from './lib/env';
import { stopCluster } from './lib/pg';
import { aptInstall, findFreePort, runInherit, SetupError, which } from './lib/proc';
import { buildWeb, clusterSpec, modeFromEnv, prepareDatabase, root, spawnServer } from './lib/stack';

const bin = (name: string) => join(root, 'node_modules', '.bin', name);
const reports = join(root, '.data', 'reports');

async function start(): Promise<number> {
  const mode = modeFromEnv();
  const url = await prepareDatabase('main', mode);
  await buildWeb();
  const port = process.env.PORT ?? '5180';
  const server = await spawnServer({ DATABASE_URL: url, PORT: port, SPLITSCOPE_MODE: mode });
  console.log(
    mode === 'shop'
      ? `
Splitscope is running at ${server.url} for your shop (database ${url.replace(/^.*\//, '')}).
First time: open ${server.url}/first-run to enter the shop's details and create its admin.
Stop with Ctrl-C; stop the database with "npm run db:stop".`
      : `
Splitscope is running at ${server.url} with the DEMO shop (invented data).
Demo sign-ins (password splitscope-demo): admin@demo.test, lead@demo.test, tech@demo.test, trainee@demo.test;
a second shop: tech@other.test.  For a real shop: "npm run start:shop".
Stop with Ctrl-C; stop the database with "npm run db:stop".`,
  );
  const stop = () => void server.stop().then(() => process.exit(0));
  process.on('SIGINT', stop);
  process.on('SIGTERM', stop);
  await new Promise<void>((r) => server.child.once('exit', () => r()));
  return server.child.exitCode ?? 0;
}

async function dev(): Promise<number> {
  const url = await prepareDatabase('main', modeFromEnv());
  const env = { ...process.env, DATABASE_URL: url, NODE_ENV: 'development' };
  const api = runInherit(bin('tsx'), ['watch', join(root, 'apps', 'server', 'src', 'main.ts')], env);
  const web = runInherit(join(root, 'apps', 'web', 'node_modules', '.bin', 'vite'), [], env, join(root, 'apps', 'web'));
  return Math.max(await api, await web);
}

interface StepResult {
  name: string;
  ok: boolean;
  passed?: number;
  failed?: number;
  skipped?: number;
}

function vitestCounts(file: string): Pick<StepResult, 'passed' | 'failed' | 'skipped'> {
  if (!existsSync(file)) return {};
  const j = JSON.parse(readFileSync(file, 'utf8')) as { numPassedTests: number; numFailedTests: number; numPendingTests: number; numTodoTests: number };
  return { passed: j.numPassedTests, failed: j.numFailedTests, skipped: j.numPendingTests + j.numTodoTests };
}

function playwrightCounts(file: string): Pick<StepResult, 'passed' | 'failed' | 'skipped'> {
  if (!existsSync(file)) return {};
  const j = JSON.parse(readFileSync(file, 'utf8')) as { stats: { expected: number; unexpected: number; flaky: number; skipped: number } };
  return { passed: j.stats.expected + j.stats.flaky, failed: j.stats.unexpected, skipped: j.stats.skipped };
}

function ensureBrowser(): void {
  if (!existsSync('/usr/bin/chromium')) aptInstall(['chromium'], 'the browser tests need Chromium');
}

/** ngspice is the reference simulator for the circuit checks; without it they use the committed values. */
function ensureNgspice(): void {
  if (which('ngspice')) return;
  try {
    aptInstall(['ngspice'], 'the circuit checks compare against ngspice');
  } catch (err) {
    console.warn(`splitscope: ${(err as Error).message}; circuit checks use the committed ngspice values`);
  }
}

async function test(): Promise<number> {
  mkdirSync(reports, { recursive: true });
  ensureBrowser();
  ensureNgspice();
  const url = await prepareDatabase('test');
  const env = { ...process.env, DATABASE_URL: url, NODE_ENV: 'test' } as NodeJS.ProcessEnv;
  const results: StepResult[] = [];
  const step = async (name: string, cmd: string, args: string[], counts?: () => Pick<StepResult, 'passed' | 'failed' | 'skipped'>) => {
    console.log(`\n── ${name} ──`);
    const code = await runInherit(cmd, args, env, root);
    results.push({ name, ok: code === 0, ...(counts?.() ?? {}) });
  };

  await step('typecheck', bin('tsx'), [join(root, 'scripts', 'typecheck.ts')]);
  await step('lint', bin('eslint'), ['.', '--max-warnings=0']);
  // One formatting for the whole tree (.prettierrc); `npm run format` rewrites what this refuses.
  await step('lint: formatting (prettier)', bin('prettier'), ['--check', '.', '--log-level', 'warn']);
  // Dead exports, unused files and dependencies nobody imports (knip.json says where each workspace starts).
  await step('lint: dead code (knip)', bin('knip'), ['--no-progress']);
  const unitJson = join(reports, 'unit.json');
  await step('unit tests', bin('vitest'), ['run', '--project', 'unit', '--reporter=default', '--reporter=json', `--outputFile.json=${unitJson}`], () =>
    vitestCounts(unitJson),
  );
  const intJson = join(reports, 'integration.json');
  await step(
    'integration tests (PostgreSQL)',
    bin('vitest'),
    ['run', '--project', 'integration', '--reporter=default', '--reporter=json', `--outputFile.json=${intJson}`],
    () => vitestCounts(intJson),
  );

  // Acknowledged readings survive server kills and database restarts: one pass/fail in the summary.
  console.log('\n── fault injection (short) ──');
  const { faultsShort } = await import('./extra-tasks');
  const faults = await faultsShort().catch((err: unknown) => {
    console.error(`faults: FAILED to run: ${(err as Error).message}`);
    return { ok: false };
  });
  results.push({ name: 'fault injection (short)', ok: faults.ok, passed: faults.ok ? 1 : 0, failed: faults.ok ? 0 : 1 });

  await buildWeb();
  // Two servers: the demo one for most browser tests, and one in shop mode with its own empty database for the
  // first-run spec. The local mail capture and payment fakes on free ports too, so `npm test` runs beside a
  // running `npm start`.
  // Separate ranges: a server's fakes start just after it answers, so a second search could find their ports free.
  const free = async (o: number) => ({
    PORT: String(await findFreePort(5300 + o)),
    SMTP_PORT: String(await findFreePort(2600 + o)),
    PAYMENTS_PORT: String(await findFreePort(12200 + o)),
  });
  // The demo server of the browser tests runs on a database of its own, seeded afresh: the integration tests'
  // leftovers (boards in older forms, odd names made on purpose) are theirs, not a page a spec should walk.
  const e2eUrl = await prepareDatabase('test', 'demo', 'e2e');
  // No fault dictionaries: their builds would take a core from the browser run (config.ts FAULT_DICTIONARIES).
  const server = await spawnServer({ DATABASE_URL: e2eUrl, LOGIN_RATE_LIMIT: '1000', FAULT_DICTIONARIES: '0', ...(await free(0)) }, { quiet: true });
  let shopServer: Awaited<ReturnType<typeof spawnServer>> | undefined;
  const e2eJson = join(reports, 'e2e.json');
  try {
    const shopUrl = await prepareDatabase('test', 'shop');
    shopServer = await spawnServer(
      {
        DATABASE_URL: shopUrl,
        SPLITSCOPE_MODE: 'shop',
        LOGIN_RATE_LIMIT: '1000',
        MAIL_CAPTURE_DIR: join(root, '.data', 'mail-shop-test'),
        ...(await free(100)),
      },
      { quiet: true },
    );
    env.BASE_URL = server.url;
    env.SHOP_BASE_URL = shopServer.url;
    env.PLAYWRIGHT_JSON_OUTPUT_NAME = e2eJson;
    await step('browser tests (Chromium)', bin('playwright'), ['test'], () => playwrightCounts(e2eJson));
  } finally {
    await shopServer?.stop();
    await server.stop();
  }

  console.log('\n── summary ──');
  let passed = 0;
  let failed = 0;
  let skipped = 0;
  for (const r of results) {
    const counts = r.passed !== undefined ? ` (${r.passed} passed, ${r.failed} failed${r.skipped ? `, ${r.skipped} skipped` : ''})` : '';
    console.log(`${r.ok ? 'ok  ' : 'FAIL'}  ${r.name}${counts}`);
    passed += r.passed ?? 0;
    failed += (r.failed ?? 0) + (r.ok || r.failed ? 0 : 1);
    skipped += r.skipped ?? 0;
  }
  console.log(`tests: ${passed} passed, ${failed} failed${skipped ? `, ${skipped} skipped` : ''}`);
  return results.every((r) => r.ok) ? 0 : 1;
}

async function main(): Promise<number> {
  loadDotEnv(root);
  const [task = 'start', ...rest] = process.argv.slice(2);
  switch (task) {
    case 'start':
      return start();
    case 'dev':
      return dev();
    case 'test':
      return test();
    case 'setup':
      await prepareDatabase('main', modeFromEnv());
      return 0;
    case 'db:stop': {
      const a = stopCluster(clusterSpec('main'));
      const b = stopCluster(clusterSpec('test'));
      console.log(a || b ? 'splitscope: database stopped' : 'splitscope: no database was running');
      return 0;
    }
    default: {
      const extra = await import('./extra-tasks').catch(() => null);
      const fn = extra?.tasks?.[task];
      if (!fn) {
        console.error(`splitscope: unknown task "${task}"`);
        return 2;
      }
      return fn(rest);
    }
  }
}

main().then(
  (code) => process.exit(code),
  (err) => {
    if (err instanceof SetupError) console.error(`splitscope: ${err.message}`);
    else console.error('splitscope:', err);
    process.exit(1);
  },
);
