import js from '@eslint/js';
import tseslint from 'typescript-eslint';
import reactHooks from 'eslint-plugin-react-hooks';

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
  { ignores: ['**/node_modules/**', '**/dist/**', '.tools/**', '.data/**', 'drizzle/**', 'test-results/**', 'playwright-report/**', 'tests/artifacts/**'] },
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
  {
    files: ['apps/web/src/**/*.{ts,tsx}'],
    plugins: { 'react-hooks': reactHooks },
    rules: { 'react-hooks/rules-of-hooks': 'error', 'react-hooks/exhaustive-deps': 'warn' },
  },
  {
    files: ['scripts/**/*.mjs'],
    languageOptions: { globals: { process: 'readonly', console: 'readonly' } },
  },
);
