/**
 * Splitscope diagnosis command line (`pnpm diagnose CASE.json [--top N] [--next N]`): which part is bad, how sure,
 * what to measure next. Prints the diagnosis as JSON on stdout; exit 0 on success, 2 with a one-line message naming
 * the problem on bad input (a bad case names the reading), 1 on anything else. The circuit command line (`pnpm
 * circuit`) stays in the circuit package, below this one.
 */
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { parseArgs } from 'node:util';
import { CaseError, diagnoseCase } from './index.js';

/** Bad input: printed as one line, exit code 2. */
class UsageError extends Error {}

const USAGE = 'usage: diagnose CASE.json [--top N] [--next N]';

function positiveInt(v: string | undefined, flag: string): number | undefined {
  if (v === undefined) return undefined;
  const n = Number(v);
  if (!Number.isInteger(n) || n < 1) throw new UsageError(`--${flag} expects a positive whole number, got "${v}"`);
  return n;
}

function args(argv: string[]): { file: string; top?: number; next?: number } {
  let parsed;
  try {
    parsed = parseArgs({ args: argv, allowPositionals: true, options: { top: { type: 'string' }, next: { type: 'string' } } });
  } catch (err) {
    throw new UsageError(`${(err as Error).message.split('\n')[0]} (${USAGE})`);
  }
  const file = parsed.positionals[0];
  if (!file || parsed.positionals.length > 1) throw new UsageError(USAGE);
  return { file, top: positiveInt(parsed.values.top, 'top'), next: positiveInt(parsed.values.next, 'next') };
}

function diagnose(argv: string[]): unknown {
  const a = args(argv);
  let text: string;
  try {
    text = readFileSync(a.file, 'utf8');
  } catch {
    throw new UsageError(`cannot read ${a.file}`);
  }
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch (err) {
    throw new UsageError(`${a.file}: not valid JSON (${(err as Error).message.split('\n')[0]})`);
  }
  try {
    return diagnoseCase(json, { top: a.top, nextTests: a.next });
  } catch (err) {
    if (err instanceof CaseError) throw new UsageError(err.message);
    throw err;
  }
}

/** Runs the command with the arguments after the program name; returns the exit code. */
export function main(argv: string[]): number {
  try {
    process.stdout.write(JSON.stringify(diagnose(argv)) + '\n');
    return 0;
  } catch (err) {
    const line = (err as Error).message?.split('\n')[0] ?? String(err);
    process.stderr.write(err instanceof UsageError ? `${line}\n` : `error: ${line}\n`);
    return err instanceof UsageError ? 2 : 1;
  }
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) process.exitCode = main(process.argv.slice(2));
