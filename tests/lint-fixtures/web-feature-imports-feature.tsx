// lint as: apps/web/src/features/home/components/lint-fixture.tsx
// must fail: import-x/no-restricted-paths
// A web feature reaching into another feature (through the @/ alias): shared code belongs in src/lib.
import { useReport } from '@/features/report/api/get-report';

export const useFixture = () => useReport('job-1');
