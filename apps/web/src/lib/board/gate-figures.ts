// The figures the discharge gate shows for a board: its bulk capacitor, bleed path and bleed time, from the
// board library's bus-safety calculation over the board model and its expected table.
import type { ExpectedReadingRow } from '@splitscope/contract';
import { BUS_CAUTIONS, busSafety, DEFAULT_SAFE_THRESHOLD } from '@splitscope/boards/references';
import type { GateFigures } from '@/components/safety-gate';
import type { BoardView } from './board-view';
import { busFigures } from './bus-figures';

const seconds = (s: number) => (s < 120 ? `${s.toPrecision(3)} s` : `${(s / 60).toPrecision(3)} min`);

export function gateFigures(view: BoardView, rows: ExpectedReadingRow[]): GateFigures {
  const bus = busFigures(view, rows);
  if (!bus)
    return {
      thresholdVolts: DEFAULT_SAFE_THRESHOLD.volts,
      thresholdSource: DEFAULT_SAFE_THRESHOLD.standard,
      bleedTime: null,
      summary: 'This board model does not name its bulk capacitor, so no bleed time can be computed: discharge the bus through a rated resistor.',
      cautions: BUS_CAUTIONS,
    };
  const s = busSafety({ capacitanceF: bus.capacitanceF, bleederOhms: bus.bleederOhms, busVolts: bus.busVolts });
  return {
    thresholdVolts: s.threshold.volts,
    thresholdSource: s.threshold.standard,
    bleedTime: s.bleedTimeS === null ? null : seconds(s.bleedTimeS),
    summary: `${bus.capacitor}${bus.bleeder ? ` with bleeder ${bus.bleeder}` : ''}: ${s.summary}`,
    cautions: s.cautions,
  };
}
