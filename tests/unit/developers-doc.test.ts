// DEVELOPERS.md is the map a newcomer reads first: every file or folder it names must exist. A path may hold a
// placeholder (<feature>, <name>), a choice ({circuit,diagnosis}) or a wildcard (NNNN_*.sql); each must match at
// least one real entry. A bare file name (`index.ts`) must exist somewhere in the tree.
import { existsSync, readdirSync, readFileSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';

const root = join(import.meta.dirname, '..', '..');
const doc = readFileSync(join(root, 'DEVELOPERS.md'), 'utf8');
const SKIP = new Set(['node_modules', '.git', '.data', '.tools', 'tests/artifacts']);

/** Paths the text names: words with a slash that start at the repo root, and back-quoted file names. */
function namedPaths(text: string): string[] {
  const out = new Set<string>();
  for (const m of text.matchAll(/(?<![\w/.:-])((?:apps|packages|scripts|tests|docs|drizzle)\/[\w.<>{},*/-]*)/g)) out.add(m[1]!.replace(/[.,]+$/, ''));
  for (const m of text.matchAll(/`([\w.-]+\.(?:ts|tsx|js|mjs|json|md))`/g)) out.add(m[1]!);
  return [...out];
}

const expand = (p: string): string[] => {
  const m = /\{([^}]*)\}/.exec(p);
  return m ? m[1]!.split(',').flatMap((alt) => expand(p.slice(0, m.index) + alt + p.slice(m.index + m[0].length))) : [p];
};

const segmentRe = (seg: string) =>
  new RegExp(
    `^${seg
      .replace(/[.+?^$()[\]\\]/g, '\\$&')
      .replace(/<[^>]+>/g, '[^/]+')
      .replace(/\*/g, '[^/]*')
      .replace(/NNNN/g, '\\d{4}')}$`,
  );

function matches(dir: string, segs: string[]): boolean {
  if (segs.length === 0) return true;
  const [seg, ...rest] = segs;
  if (!/[<*]|NNNN/.test(seg!)) return existsSync(join(dir, seg!)) && matches(join(dir, seg!), rest);
  if (!existsSync(dir) || !statSync(dir).isDirectory()) return false;
  const re = segmentRe(seg!);
  return readdirSync(dir).some((e) => re.test(e) && matches(join(dir, e), rest));
}

function findByName(dir: string, name: string): boolean {
  for (const e of readdirSync(dir, { withFileTypes: true })) {
    if (SKIP.has(e.name)) continue;
    if (e.name === name) return true;
    if (e.isDirectory() && findByName(join(dir, e.name), name)) return true;
  }
  return false;
}

describe('DEVELOPERS.md', () => {
  const paths = namedPaths(doc);
  it('names paths (the extraction works)', () => {
    expect(paths).toContain('packages/contract/src/policy.ts');
    expect(paths.length).toBeGreaterThan(20);
  });
  it.each(paths)('%s exists', (p) => {
    const ok = p.includes('/') ? expand(p).every((x) => matches(root, x.split('/').filter(Boolean))) : findByName(root, p);
    expect(ok, `${p} is named in DEVELOPERS.md but not in the tree`).toBe(true);
  });
});
