// lint as: apps/server/src/features/uploads/lint-fixture.ts
// must fail: import-x/no-restricted-paths
// A server feature importing a file inside another feature instead of that feature's index.ts.
import { findReadings } from '../readings/service';

export const fixture = findReadings;
