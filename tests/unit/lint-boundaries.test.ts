// Each file in tests/lint-fixtures breaks one lint rule on purpose (the project's lint run ignores that folder).
// It is linted here as if it stood where its first line says, and must fail with the rule its second line names;
// docs/decisions/0003-lint-boundaries.md lists the rules.
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { ESLint } from 'eslint';
import { describe, expect, it } from 'vitest';

const root = join(import.meta.dirname, '..', '..');
const dir = join(root, 'tests', 'lint-fixtures');
const fixtures = readdirSync(dir).map((name) => {
  const code = readFileSync(join(dir, name), 'utf8');
  const [, lintAs] = /^\/\/ lint as: (\S+)/m.exec(code) ?? [];
  const [, rule] = /^\/\/ must fail: (\S+)/m.exec(code) ?? [];
  if (!lintAs || !rule) throw new Error(`${name}: the first lines must say "// lint as: <path>" and "// must fail: <rule>"`);
  return { name, code, lintAs, rule };
});

describe('lint rules fail on their fixtures', () => {
  const eslint = new ESLint({ cwd: root });
  it.each(fixtures)(
    '$name fails with $rule',
    async ({ code, lintAs, rule }) => {
      const [result] = await eslint.lintText(code, { filePath: join(root, lintAs) });
      const rules = result!.messages.map((m) => m.ruleId);
      expect(rules).toContain(rule);
    },
    120_000,
  );
});
