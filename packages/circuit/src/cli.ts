/**
 * Splitscope circuit command line.
 *   circuit op FILE.cir
 *   circuit read FILE.cir --mode ohm --red vfan --black 0 [--power off|on] [--lift C2,C3] [--param FAN_ON=0]
 * Prints JSON on stdout; exit 0 on success, 2 with a one-line message on bad input. (Diagnosis has its own command,
 * packages/diagnosis/src/cli.ts: the engine above this package.)
 * It imports the modules it uses, not the package entry, so the expression engine (mathjs, slower to load than all
 * the rest) loads only for a netlist with {expressions} or .param values (`withExpressions`): `circuit op` on a plain
 * netlist starts in a fraction of the time.
 */
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { ExpressionEngineMissing } from './expressions';
import { flatten } from './flatten';
import { applyState, read } from './meter';
import { MeasurementError, type MeterMode } from './meter-types';
import { parseNetlist } from './netlist';
import { NetlistError, type Netlist } from './netlist-types';
import { solveOp } from './solver';

/** Bad input: printed as one line, exit code 2. */
export class UsageError extends Error {}

export type Command = (args: string[]) => unknown | Promise<unknown>;

function loadNetlist(file: string | undefined): Netlist {
  if (!file) throw new UsageError('missing netlist file');
  let text: string;
  try {
    text = readFileSync(file, 'utf8');
  } catch {
    throw new UsageError(`cannot read ${file}`);
  }
  return parseNetlist(text);
}

/** Splits `--key value` flags from positional arguments. */
export function parseFlags(args: string[], allowed: readonly string[]): { positional: string[]; flags: Record<string, string> } {
  const positional: string[] = [];
  const flags: Record<string, string> = {};
  for (let i = 0; i < args.length; i++) {
    const a = args[i] as string;
    if (a.startsWith('--')) {
      const eq = a.indexOf('=');
      const key = eq > 0 ? a.slice(2, eq) : a.slice(2);
      if (!allowed.includes(key)) throw new UsageError(`unknown option --${key}`);
      const val = eq > 0 ? a.slice(eq + 1) : args[++i];
      if (val === undefined) throw new UsageError(`--${key} needs a value`);
      // --param may repeat
      flags[key] = key in flags && key === 'param' ? `${flags[key]},${val}` : val;
    } else positional.push(a);
  }
  return { positional, flags };
}

function parseParams(spec: string | undefined): Record<string, number> {
  const out: Record<string, number> = {};
  if (!spec) return out;
  for (const item of spec.split(',')) {
    const [k, v] = item.split('=');
    const n = Number(v);
    if (!k || v === undefined || v.trim() === '' || !Number.isFinite(n)) throw new UsageError(`--param expects NAME=number, got "${item}"`);
    out[k.trim()] = n;
  }
  return out;
}

/** Runs f; when it meets an expression before the engine is loaded, loads the engine and runs f again (f is pure). */
async function withExpressions<T>(f: () => T): Promise<T> {
  try {
    return f();
  } catch (err) {
    if (!(err instanceof ExpressionEngineMissing)) throw err;
    await import('./mathjs-engine');
    return f();
  }
}

const op: Command = (args) => {
  const { positional, flags } = parseFlags(args, ['param']);
  const nl = loadNetlist(positional[0]);
  const params = parseParams(flags.param);
  return withExpressions(() => {
    const r = solveOp(flatten(nl, params));
    if (!r.converged) return { converged: false, message: r.message };
    return { converged: true, nodes: r.nodes, sources: r.sources };
  });
};

const MODES: readonly MeterMode[] = ['dcv', 'ohm', 'diode', 'continuity'];

const readCmd: Command = (args) => {
  const { positional, flags } = parseFlags(args, ['mode', 'red', 'black', 'power', 'lift', 'param']);
  const nl = loadNetlist(positional[0]);
  const mode = flags.mode as MeterMode | undefined;
  if (!mode || !MODES.includes(mode)) throw new UsageError(`--mode must be one of ${MODES.join(', ')}`);
  if (!flags.red || !flags.black) throw new UsageError('--red and --black are required');
  const power = flags.power ?? (mode === 'dcv' ? 'on' : 'off');
  if (power !== 'on' && power !== 'off') throw new UsageError('--power must be on or off');
  const lifted = flags.lift
    ? flags.lift
        .split(',')
        .map((s) => s.trim())
        .filter(Boolean)
    : [];
  const params = parseParams(flags.param);
  return withExpressions(() => {
    const reading = read(nl, { mode, red: flags.red as string, black: flags.black as string, power, lifted, params });
    return reading.beep === undefined ? { value: reading.value, unit: reading.unit } : reading;
  });
};

/** Subcommands by name. */
export const commands: Record<string, Command> = {
  op,
  read: readCmd,
  // state: an `applyState` view for debugging: the elements left in a board state
  state: (args) => {
    const { positional, flags } = parseFlags(args, ['power', 'lift', 'param']);
    const nl = loadNetlist(positional[0]);
    const power = flags.power ?? 'off';
    if (power !== 'on' && power !== 'off') throw new UsageError('--power must be on or off');
    const params = parseParams(flags.param);
    return withExpressions(() => ({
      elements: applyState(nl, { power, lifted: flags.lift ? flags.lift.split(',') : [], params }).elements.map((e) => e.name),
    }));
  },
};

export async function main(argv: string[]): Promise<number> {
  const [name, ...rest] = argv;
  const cmd = name ? commands[name] : undefined;
  try {
    if (!cmd) throw new UsageError(`usage: circuit <${Object.keys(commands).join('|')}> FILE [options]`);
    const out = await cmd(rest);
    process.stdout.write(JSON.stringify(out) + '\n');
    return 0;
  } catch (err) {
    if (err instanceof UsageError || err instanceof NetlistError || err instanceof MeasurementError) {
      process.stderr.write(`${err.message.split('\n')[0]}\n`);
      return 2;
    }
    process.stderr.write(`error: ${(err as Error).message?.split('\n')[0] ?? String(err)}\n`);
    return 1;
  }
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  void main(process.argv.slice(2)).then((code) => {
    process.exitCode = code;
  });
}
