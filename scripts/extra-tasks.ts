// Tasks beyond start/test: fault injection, fuzzing and the benchmarks that need the running stack.
import { runFuzz } from './proof/fuzz';
import { printFuzzReport } from './proof/fuzz-report';
import { printApiBench, runApiBench } from './proof/bench-api';
import { printLoadBench, runLoadBench } from './proof/bench-load';
import { printWebBench, runWebBench } from './proof/bench-web';
import { FULL, printFaultReport, runFaults, SHORT, type FaultReport } from './proof/faults';
import { modeFromEnv, prepareDatabase } from './lib/stack';

/**
 * The short fault-injection run for `npm test` (about 30 s): 4 technicians, 2 server SIGKILLs, 2 PostgreSQL
 * restarts on a cluster of its own. Prints its counts; `ok` is false when an acknowledged reading was lost or
 * stored twice, or the server did not answer 503 with Retry-After while the database was down.
 */
export async function faultsShort(): Promise<FaultReport> {
  const report = await runFaults({ ...SHORT, log: console.log });
  printFaultReport(report);
  return report;
}

async function faults(args: string[]): Promise<number> {
  const report = await runFaults({ ...(args.includes('--short') ? SHORT : FULL), log: console.log });
  printFaultReport(report);
  return report.ok ? 0 : 1;
}

async function fuzz(args: string[]): Promise<number> {
  const n = Number(args.find((a) => a.startsWith('--runs='))?.slice(7) ?? 4000);
  const seedArg = args.find((a) => a.startsWith('--seed='));
  const onlyArg = args.find((a) => a.startsWith('--routes='));
  const report = await runFuzz({
    total: Number.isFinite(n) && n > 0 ? n : 4000,
    seed: seedArg ? Number(seedArg.slice(7)) : undefined,
    only: onlyArg ? new RegExp(onlyArg.slice(9)) : undefined,
    log: console.log,
  });
  printFuzzReport(report);
  return report.ok ? 0 : 1;
}

async function benchApi(args: string[]): Promise<number> {
  const seconds = Number(args.find((a) => a.startsWith('--seconds='))?.slice(10) ?? 10);
  const report = await runApiBench({ connections: 50, seconds: Number.isFinite(seconds) && seconds > 0 ? seconds : 10, log: console.log });
  printApiBench(report);
  // A missed target is a figure to report, not a broken command: exit 0 unless the run itself failed.
  return report.writes.failed + report.diagnosis.failed === 0 ? 0 : 1;
}

/** `bench:load [--servers=2] [--kill] [--seconds=30] [--technicians=300]`: the open-loop load (bench-load.ts). */
async function benchLoad(args: string[]): Promise<number> {
  const num = (name: string, fallback: number) => {
    const v = Number(args.find((a) => a.startsWith(`--${name}=`))?.slice(name.length + 3));
    return Number.isFinite(v) && v > 0 ? v : fallback;
  };
  const report = await runLoadBench({
    technicians: num('technicians', 300),
    periodMs: 3000,
    seconds: num('seconds', 30),
    servers: num('servers', 1) === 2 ? 2 : 1,
    kill: args.includes('--kill'),
    log: console.log,
  });
  printLoadBench(report);
  // Missed latency targets are figures to report; a lost acknowledged reading fails the command.
  return report.stored === report.acknowledged ? 0 : 1;
}

async function benchWeb(): Promise<number> {
  const report = await runWebBench({ points: 1000, seconds: 5 });
  printWebBench(report);
  return 0;
}

/** `dictionary:build [--board <id, key or name>]`: the fault dictionaries stored versions lack, on the main database. */
async function dictionaryBuild(args: string[]): Promise<number> {
  const i = args.indexOf('--board');
  const board = i >= 0 ? args[i + 1] : args.find((a) => a.startsWith('--board='))?.slice(8);
  const url = await prepareDatabase('main', modeFromEnv());
  const { buildMissingDictionaries } = await import('../apps/server/src/features/diagnosis/dictionary-command');
  return buildMissingDictionaries(url, board, (line) => console.log(`splitscope: ${line}`));
}

export const tasks: Record<string, (args: string[]) => Promise<number>> = {
  'dictionary:build': dictionaryBuild,
  faults,
  fuzz,
  'bench:api': benchApi,
  'bench:load': benchLoad,
  'bench:web': benchWeb,
};
