// lint as: packages/circuit/src/lint-fixture.ts
// must fail: no-restricted-imports
// The circuit engine reading a file: engine packages compute, they do no I/O.
import { readFileSync } from 'node:fs';

export const fixture = () => readFileSync('board.cir', 'utf8');
