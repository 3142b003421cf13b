import { readdirSync } from 'node:fs';
import { join } from 'node:path';
import js from '@eslint/js';
import tseslint from 'typescript-eslint';
import reactHooks from 'eslint-plugin-react-hooks';
import importX from 'eslint-plugin-import-x';
import { createTypeScriptImportResolver } from 'eslint-import-resolver-typescript';
import splitscope from './scripts/lint/no-feature-cycle.js';

// Each rule below is described, with a file that breaks it, in docs/decisions/0003-lint-boundaries.md; the files
// under tests/lint-fixtures/ must fail (tests/unit/lint-boundaries.test.ts runs ESLint on them).

const dirs = (path) =>
  readdirSync(join(import.meta.dirname, path), { withFileTypes: true })
    .filter((d) => d.isDirectory())
    .map((d) => d.name);
const webFeatures = dirs('./apps/web/src/features/');
const serverFeatures = dirs('./apps/server/src/features/');
const webFeaturesDir = './apps/web/src/features';
const serverFeaturesDir = './apps/server/src/features';

// The engine packages stay pure: no Node I/O, no DB, no React. Only their CLI and benchmarks may touch Node.
const enginePurity = {
  files: ['packages/*/src/**/*.ts'],
  ignores: ['packages/*/src/cli.ts', 'packages/*/src/cli/**', 'packages/*/src/**/*.test.ts'],
  rules: {
    'no-restricted-imports': [
      'error',
      {
        patterns: [
          { group: ['node:*', 'fs', 'path', 'child_process', 'os', 'http', 'net'], message: 'Engine packages are pure: no Node I/O.' },
          { group: ['react', 'react-dom', 'express', 'drizzle-orm', 'drizzle-orm/*', 'pg'], message: 'Engine packages are pure: no UI, server or DB.' },
        ],
      },
    ],
  },
};

// Where code may import from, by folder. The resolver follows the tsconfig paths (`@/…`, `@splitscope/…`), so an
// alias cannot hide a forbidden import.
const zones = [
  { target: './packages', from: './apps', message: 'packages/* never import the apps.' },
  // A web feature never imports another feature: what two features share moves to src/lib or src/components.
  ...webFeatures.map((f) => ({
    target: `${webFeaturesDir}/${f}`,
    from: webFeaturesDir,
    except: [`./${f}`],
    message: 'A web feature never imports another feature; move what they share to src/lib or src/components.',
  })),
  // A server feature uses another feature only through that feature's index.ts.
  ...serverFeatures.map((f) => ({
    target: `${serverFeaturesDir}/${f}`,
    from: serverFeaturesDir,
    except: [`./${f}`, ...serverFeatures.filter((g) => g !== f).map((g) => `./${g}/index.ts`)],
    message: "A server feature imports another feature only through that feature's index.ts.",
  })),
];

const boundaries = {
  files: ['apps/*/src/**/*.{ts,tsx}', 'packages/*/src/**/*.ts'],
  plugins: { 'import-x': importX },
  settings: {
    'import-x/resolver-next': [
      createTypeScriptImportResolver({
        project: ['apps/web/tsconfig.json', 'apps/server/tsconfig.json', 'packages/*/tsconfig.json'],
        noWarnOnMultipleProjects: true,
      }),
    ],
  },
  rules: { 'import-x/no-restricted-paths': ['error', { zones }] },
};

// No import cycles: between files (import-x/no-cycle), and between the features of an app, which import each
// other through index files and so form cycles no single file shows (scripts/lint/no-feature-cycle.js).
const noCycles = {
  files: ['apps/*/src/**/*.{ts,tsx}', 'packages/*/src/**/*.ts'],
  plugins: { 'import-x': importX, splitscope },
  rules: { 'import-x/no-cycle': ['error', { ignoreExternal: true }], 'splitscope/no-feature-cycle': 'error' },
};

// Promises that nobody awaits lose their errors; a promise handed where a plain callback is expected (an
// onClick, an event handler) is never awaited either. Both need the types, so these two rules run type-aware.
const promises = {
  files: ['**/*.{ts,tsx}'],
  languageOptions: {
    parserOptions: {
      // The lint-fixture paths are where tests/unit/lint-boundaries.test.ts lints its fixtures; no such file is on disk.
      projectService: {
        allowDefaultProject: [
          'vitest.config.ts',
          'playwright.config.ts',
          'apps/*/src/features/*/lint-fixture.ts',
          'apps/web/src/features/*/components/lint-fixture.tsx',
          'packages/*/src/lint-fixture.ts',
        ],
      },
      tsconfigRootDir: import.meta.dirname,
    },
  },
  rules: {
    '@typescript-eslint/no-floating-promises': 'error',
    // JSX handlers included: a form hands React a plain handler (lib/forms.ts `formSubmit`), which starts the
    // async submit and shows its failure through the mutation's state.
    '@typescript-eslint/no-misused-promises': 'error',
  },
};

// The local fakes (mail capture, test payments) are development code under apps/server/dev: the server loads
// them with a dynamic import() only when LOCAL_FAKES is on, so no static import may pull them in.
const serverWithoutFakes = {
  files: ['apps/server/src/**/*.ts'],
  rules: {
    '@typescript-eslint/no-restricted-imports': [
      'error',
      { patterns: [{ group: ['**/dev/**'], message: 'Development fakes load only through import() when LOCAL_FAKES is on.', allowTypeImports: true }] },
    ],
  },
};

export default tseslint.config(
  {
    ignores: [
      '**/node_modules/**',
      '**/dist/**',
      '.tools/**',
      '.data/**',
      'drizzle/**',
      'test-results/**',
      'playwright-report/**',
      'tests/artifacts/**',
      'tests/lint-fixtures/**',
    ],
  },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
      '@typescript-eslint/no-explicit-any': 'error',
    },
  },
  enginePurity,
  serverWithoutFakes,
  boundaries,
  noCycles,
  promises,
  {
    files: ['apps/web/src/**/*.{ts,tsx}'],
    plugins: { 'react-hooks': reactHooks },
    rules: { 'react-hooks/rules-of-hooks': 'error', 'react-hooks/exhaustive-deps': 'warn' },
  },
  {
    files: ['scripts/**/*.mjs', 'eslint.config.js'],
    languageOptions: { globals: { process: 'readonly', console: 'readonly' } },
  },
);
