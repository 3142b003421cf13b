/**
 * `circuit diagnose CASE.json [--top N] [--next N]`: which part is bad, how sure, what to measure next.
 * Prints the diagnosis as JSON; a bad case exits 2 with a one-line message naming the reading.
 */
import { readFileSync } from 'node:fs';
// Relative import: the CLI lives in this package, the diagnosis engine depends on this package (no cycle in
// package.json); the command is loaded lazily by cli.ts.
import { CaseError, diagnoseCase } from '../../../diagnosis/src/index';
import { parseFlags, UsageError, type Command } from '../cli';

function positiveInt(v: string | undefined, flag: string): number | undefined {
  if (v === undefined) return undefined;
  const n = Number(v);
  if (!Number.isInteger(n) || n < 1) throw new UsageError(`--${flag} expects a positive whole number, got "${v}"`);
  return n;
}

export const diagnose: Command = (args) => {
  const { positional, flags } = parseFlags(args, ['top', 'next']);
  const file = positional[0];
  if (!file) throw new UsageError('usage: circuit diagnose CASE.json [--top N] [--next N]');
  let text: string;
  try {
    text = readFileSync(file, 'utf8');
  } catch {
    throw new UsageError(`cannot read ${file}`);
  }
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch (err) {
    throw new UsageError(`${file}: not valid JSON (${(err as Error).message.split('\n')[0]})`);
  }
  try {
    return diagnoseCase(json, { top: positiveInt(flags.top, 'top'), nextTests: positiveInt(flags.next, 'next') });
  } catch (err) {
    if (err instanceof CaseError) throw new UsageError(err.message);
    throw err;
  }
};
