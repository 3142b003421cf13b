// lint as: apps/server/src/features/health/lint-fixture.ts
// must fail: @typescript-eslint/no-floating-promises
// A promise nobody awaits: its rejection would be lost.
async function store(): Promise<void> {
  throw new Error('lost');
}

export function fixture(): void {
  store();
}
