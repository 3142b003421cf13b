// Benchmark: composing the demo boards and computing their expected-readings tables (cold, then cached).
// Prints figures; run with `pnpm --filter @splitscope/boards bench` (or tsx packages/boards/bench/boards.bench.ts).
import { composeBoard, INDOOR_FAN_SPEC, OUTDOOR_FAN_SPEC } from '../src/index';
import { expectedReadings } from '../src/readings/index';

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;
const time = (f: () => unknown) => {
  const t = performance.now();
  f();
  return performance.now() - t;
};

for (const spec of [OUTDOOR_FAN_SPEC, INDOOR_FAN_SPEC]) {
  const compose = median(Array.from({ length: 20 }, () => time(() => composeBoard(spec))));
  const boards = Array.from({ length: 5 }, () => composeBoard(spec));
  const cold = median(boards.map((b) => time(() => expectedReadings(b))));
  const warm = median(boards.map((b) => time(() => expectedReadings(b))));
  const b = boards[0]!;
  const rows = expectedReadings(b).length;
  console.log(
    `${spec.id}: ${b.parts.length} parts, ${b.testPoints.length} test points, ${rows} expected rows — ` +
      `composeBoard ${compose.toFixed(2)} ms, expectedReadings cold ${cold.toFixed(0)} ms, cached ${warm.toFixed(3)} ms (medians)`,
  );
}
