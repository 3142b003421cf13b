// ESLint rule: the features of an app (apps/<app>/src/features/<feature>) must not depend on each other in a
// circle. A feature imports another through its index.ts (the zones in eslint.config.js), so cycles between
// features never show as a cycle between two files, and import-x/no-cycle does not see them. This rule builds
// the graph of features from the files on disk (once per lint run) and reports an import whose target feature
// leads back, through any chain, to the importing feature.
import { readdirSync, readFileSync } from 'node:fs';
import { dirname, join, relative, resolve, sep } from 'node:path';

const IMPORT = /^\s*(?:import|export)\s[^'"]*?\sfrom\s+['"]([^'"]+)['"]|^\s*import\s+['"]([^'"]+)['"]/gm;

/** The features folder a file lies in, and the feature: null outside apps/<app>/src/features/. */
function locate(file) {
  const m = /^(.*[/\\]apps[/\\][^/\\]+[/\\]src[/\\]features)[/\\]([^/\\]+)[/\\]/.exec(file);
  return m ? { dir: m[1], feature: m[2] } : null;
}

/** The feature an import specifier points at, from `fromFile` (relative paths and the web's `@/` alias). */
function targetFeature(dir, fromFile, spec) {
  let path;
  if (spec.startsWith('.')) path = resolve(dirname(fromFile), spec);
  else if (spec.startsWith('@/')) path = join(dirname(dir), spec.slice(2));
  else return null;
  const rel = relative(dir, path);
  if (rel === '' || rel.startsWith('..')) return null;
  return rel.split(sep)[0];
}

function* sourceFiles(dir) {
  for (const e of readdirSync(dir, { withFileTypes: true })) {
    const p = join(dir, e.name);
    if (e.isDirectory()) yield* sourceFiles(p);
    else if (/\.(ts|tsx)$/.test(e.name) && !/\.test\.tsx?$/.test(e.name)) yield p;
  }
}

const graphs = new Map();
/** feature → the features its files import, read from disk once per features folder. */
function graphOf(dir) {
  let g = graphs.get(dir);
  if (g) return g;
  g = new Map();
  for (const feature of readdirSync(dir, { withFileTypes: true })
    .filter((e) => e.isDirectory())
    .map((e) => e.name)) {
    const deps = new Set();
    for (const file of sourceFiles(join(dir, feature))) {
      for (const m of readFileSync(file, 'utf8').matchAll(IMPORT)) {
        const to = targetFeature(dir, file, m[1] ?? m[2]);
        if (to && to !== feature) deps.add(to);
      }
    }
    g.set(feature, deps);
  }
  graphs.set(dir, g);
  return g;
}

/** A chain of features from `from` to `to`, or null (breadth first, so the shortest). */
function chain(g, from, to) {
  const prev = new Map([[from, null]]);
  const queue = [from];
  while (queue.length) {
    const f = queue.shift();
    if (f === to) {
      const path = [];
      for (let x = f; x !== null; x = prev.get(x)) path.unshift(x);
      return path;
    }
    for (const d of g.get(f) ?? []) {
      if (prev.has(d)) continue;
      prev.set(d, f);
      queue.push(d);
    }
  }
  return null;
}

export const noFeatureCycle = {
  meta: {
    type: 'problem',
    docs: { description: 'Features of an app never import each other in a circle.' },
    messages: { cycle: 'Feature cycle: {{path}}. Move what both need below the features (src/db, src/lib) or into the one that uses it.' },
    schema: [],
  },
  create(context) {
    const here = locate(context.filename);
    if (!here) return {};
    const g = graphOf(here.dir);
    const check = (node) => {
      if (!node.source || typeof node.source.value !== 'string') return;
      const to = targetFeature(here.dir, context.filename, node.source.value);
      if (!to || to === here.feature) return;
      const back = chain(g, to, here.feature);
      if (back) context.report({ node: node.source, messageId: 'cycle', data: { path: [here.feature, ...back].join(' → ') } });
    };
    return { ImportDeclaration: check, ExportNamedDeclaration: check, ExportAllDeclaration: check };
  },
};

export default { rules: { 'no-feature-cycle': noFeatureCycle } };
