// lint as: packages/boards/src/lint-fixture.ts
// must fail: import-x/no-restricted-paths
// A package depending on an app: the arrow points the wrong way.
import { ROLES } from '../../../apps/server/src/auth/guards';

export const fixture = ROLES;
