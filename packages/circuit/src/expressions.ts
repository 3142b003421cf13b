/**
 * Evaluation of netlist {expressions} and .param values, through an expression engine that is registered, not
 * imported: the engine (mathjs, `mathjs-engine.ts`) costs more to load than the rest of the package, and a netlist
 * of plain numbers never needs it. The package entry (index.ts) registers it, so every caller of the package gets it;
 * the command line loads it only when a netlist asks for an expression (cli.ts).
 */
import { NetlistError } from './netlist-types';

/** Compiles an expression (SPICE suffixes already rewritten) into a function of the parameter scope. */
interface ExpressionEngine {
  compile(expr: string): (scope: Map<string, number>) => unknown;
}

let engine: ExpressionEngine | undefined;

export function setExpressionEngine(e: ExpressionEngine): void {
  engine = e;
  compiled.clear();
}

/** An expression was met before an engine was registered (only a caller that bypasses index.ts can meet it). */
export class ExpressionEngineMissing extends Error {
  constructor() {
    super('no expression engine is registered (import @splitscope/circuit, or its mathjs-engine module, first)');
    this.name = 'ExpressionEngineMissing';
  }
}

const compiled = new Map<string, (scope: Map<string, number>) => unknown>();

/** The value of {expr} in `scope` as a finite number (a boolean counts 1 or 0); a NetlistError naming `what` otherwise. */
export function evalExpr(expr: string, scope: Map<string, number>, line: number, what: string): number {
  if (!engine) throw new ExpressionEngineMissing();
  let fn = compiled.get(expr);
  if (!fn) {
    try {
      fn = engine.compile(expr);
    } catch (err) {
      throw new NetlistError(line, `${what}: cannot parse {${expr}}: ${(err as Error).message}`);
    }
    if (compiled.size > 5000) compiled.clear();
    compiled.set(expr, fn);
  }
  let v: unknown;
  try {
    v = fn(new Map(scope));
  } catch (err) {
    throw new NetlistError(line, `${what}: cannot evaluate {${expr}}: ${(err as Error).message}`);
  }
  if (typeof v === 'boolean') return v ? 1 : 0;
  if (typeof v !== 'number' || !Number.isFinite(v)) {
    throw new NetlistError(line, `${what}: {${expr}} does not give a finite number`);
  }
  return v;
}
