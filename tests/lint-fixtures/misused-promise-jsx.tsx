// lint as: apps/web/src/features/home/components/lint-fixture.tsx
// must fail: @typescript-eslint/no-misused-promises
// An async submit handed straight to a form: React drops the promise, so a rejection goes nowhere.
export function Fixture({ save }: { save: () => Promise<void> }) {
  return <form onSubmit={async () => save()} />;
}
