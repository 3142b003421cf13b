// lint as: apps/server/src/features/diagnosis/lint-fixture.ts
// must fail: splitscope/no-feature-cycle
// The jobs feature uses diagnosis (a job's ranking); diagnosis importing jobs back closes a circle.
import { moveJob } from '../jobs';

export const fixture = moveJob;
