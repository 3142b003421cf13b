/**
 * Netlist text to cards: comments and continuation lines, tokens (braces and `name = value` joined) and values
 * (SPICE numbers or {expressions}).
 */
import { NetlistError, type RawValue } from './netlist-types';
import { parseSpiceNumber } from './values';

export interface Card {
  tokens: string[];
  line: number;
}

/** Strips `;` and `$` inline comments (outside braces). */
function stripInlineComment(s: string): string {
  let depth = 0;
  for (let i = 0; i < s.length; i++) {
    const ch = s[i];
    if (ch === '{') depth++;
    else if (ch === '}') depth = Math.max(0, depth - 1);
    else if (depth === 0 && (ch === ';' || ch === '$')) return s.slice(0, i);
  }
  return s;
}

/** Splits a card into tokens: whitespace, commas and parentheses separate; `=` is its own token; braces stay whole. */
function tokenize(s: string, line: number): string[] {
  const out: string[] = [];
  let cur = '';
  let depth = 0;
  const flush = () => {
    if (cur !== '') out.push(cur);
    cur = '';
  };
  for (const ch of s) {
    if (depth > 0) {
      cur += ch;
      if (ch === '{') depth++;
      else if (ch === '}') {
        depth--;
        if (depth === 0) flush();
      }
      continue;
    }
    if (ch === '{') {
      flush();
      cur = '{';
      depth = 1;
    } else if (/\s/.test(ch) || ch === ',' || ch === '(' || ch === ')') flush();
    else if (ch === '=') {
      flush();
      out.push('=');
    } else cur += ch;
  }
  if (depth > 0) throw new NetlistError(line, `unbalanced "{" in "${s.trim()}"`);
  flush();
  return out;
}

/** Joins `k = v` token triples into "k=v" tokens. */
function joinAssignments(tokens: string[], line: number): string[] {
  const out: string[] = [];
  for (let i = 0; i < tokens.length; i++) {
    const t = tokens[i] as string;
    if (t === '=') {
      const prev = out.pop();
      const next = tokens[i + 1];
      if (prev === undefined || next === undefined || next === '=') throw new NetlistError(line, 'misplaced "="');
      out.push(`${prev}=${next}`);
      i++;
    } else out.push(t);
  }
  return out;
}

export function toCards(text: string, firstIsTitle: boolean): { title: string; cards: Card[] } {
  const lines = text.split(/\r?\n/);
  const cards: Card[] = [];
  let title = '';
  let pending: { text: string; line: number } | undefined;
  const push = () => {
    if (!pending) return;
    const tokens = joinAssignments(tokenize(pending.text, pending.line), pending.line);
    if (tokens.length > 0) cards.push({ tokens, line: pending.line });
    pending = undefined;
  };
  let inControl = false;
  for (let i = 0; i < lines.length; i++) {
    const raw = lines[i] as string;
    const lineNo = i + 1;
    if (i === 0 && firstIsTitle) {
      title = raw.trim();
      continue;
    }
    const trimmed = raw.trim();
    if (inControl) {
      if (/^\.endc\b/i.test(trimmed)) inControl = false;
      continue;
    }
    if (/^\.control\b/i.test(trimmed)) {
      push();
      inControl = true;
      continue;
    }
    if (trimmed === '' || trimmed.startsWith('*')) continue;
    if (trimmed.startsWith('+')) {
      const rest = stripInlineComment(trimmed.slice(1));
      if (!pending) throw new NetlistError(lineNo, 'continuation line "+" with nothing to continue');
      pending.text += ' ' + rest;
      continue;
    }
    push();
    pending = { text: stripInlineComment(trimmed), line: lineNo };
  }
  push();
  return { title, cards };
}

export function rawValue(token: string, line: number, what: string): RawValue {
  if (token.startsWith('{')) {
    if (!token.endsWith('}')) throw new NetlistError(line, `${what}: unbalanced braces in "${token}"`);
    const expr = token.slice(1, -1).trim();
    if (expr === '') throw new NetlistError(line, `${what}: empty expression "{}"`);
    return { kind: 'expr', expr };
  }
  const n = parseSpiceNumber(token);
  if (n !== undefined) return { kind: 'number', value: n };
  if (/^[A-Za-z_][\w]*$/.test(token)) return { kind: 'expr', expr: token };
  throw new NetlistError(line, `${what}: "${token}" is not a number or {expression}`);
}

export function splitAssignment(tok: string, line: number, what: string): [string, RawValue] {
  const eq = tok.indexOf('=');
  const key = tok.slice(0, eq).toLowerCase();
  const val = tok.slice(eq + 1);
  if (key === '' || val === '') throw new NetlistError(line, `${what}: bad assignment "${tok}"`);
  return [key, rawValue(val, line, `${what} ${key}`)];
}
