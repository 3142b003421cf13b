// lint as: apps/server/src/features/health/lint-fixture.ts
// must fail: @typescript-eslint/no-misused-promises
// An async function where a plain callback is expected: the emitter never awaits it.
import { EventEmitter } from 'node:events';

export function fixture(events: EventEmitter): void {
  events.on('stop', async () => {
    await Promise.resolve();
  });
}
