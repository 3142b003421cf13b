/**
 * What the free bench is pointed at: the chosen test (a point's row, a next test, a lifted part's pads or the
 * part alone on its own pins), the parts lifted right now and the part picked in the ranking. Guided order
 * points the bench at the engine's step instead, so there the chosen test is the step's.
 */
import { pinWord, type ExpectedReadingRow, type MeterModeName } from '@splitscope/contract';
import { useMemo, useState } from 'react';
import type { BoardView } from '@/lib/board/board-view';
import { rowsForPoint, type Target } from './bench-model';

export type BenchTarget = Target & { pointId?: string };

export interface LiftablePart {
  /** The netlist element (what readings name in `lifted` and `alone`). */
  id: string;
  label: string;
  designator: string;
  pins: { pin: string; net: string; word: string }[];
}

const DIODE_KINDS = new Set(['diode', 'led', 'zener']);

export function useBenchTarget({
  view,
  rows,
  guided,
  step,
}: {
  view: BoardView;
  rows: ExpectedReadingRow[];
  guided: boolean;
  step?: { target: Target; pointId?: string };
}) {
  const [target, setTarget] = useState<BenchTarget | null>(null);
  const [selectedPart, setSelectedPart] = useState<string | null>(null);
  const [lifted, setLifted] = useState<string[]>([]);

  const liftable: LiftablePart[] = useMemo(
    () =>
      (view.model?.parts ?? [])
        .filter((p) => p.element)
        .map((p) => ({
          id: p.element!,
          designator: p.designator,
          label: view.parts.find((x) => x.id === p.designator)?.label ?? p.designator,
          pins: p.pins.map((x) => ({ pin: x.pin, net: x.net, word: pinWord(p.kind, x.pin) })),
        })),
    [view],
  );
  const kindOf = (id: string) => view.model?.parts.find((p) => p.element === id)?.kind ?? '';

  const active: BenchTarget | null = guided ? (step ? { ...step.target, pointId: step.pointId } : null) : target;

  const selectPoint = (id: string) => {
    if (guided) return;
    const choices = rowsForPoint(view, rows, id);
    const p = view.pointOf(id)!;
    const row = choices.find((r) => r.power === 'on') ?? choices[0];
    // With parts lifted the board is not as built: the test keeps the point's probes and takes the lifted set.
    const base = row
      ? { mode: row.mode, red: row.red, black: row.black, power: row.power }
      : { mode: 'dcv' as const, red: p.id, black: '0', power: 'on' as const };
    setTarget(
      lifted.length
        ? { ...base, mode: base.mode === 'dcv' ? 'ohm' : base.mode, power: 'off', lifted, pointId: id }
        : { ...base, lifted: row?.lifted ?? [], pointId: id },
    );
  };
  /** A lifted two-pin part's pads on the board (the circuit without the part). */
  const measurePads = (part: string) => {
    const p = liftable.find((x) => x.id === part);
    if (!p || p.pins.length !== 2) return;
    setTarget({ mode: 'ohm', red: p.pins[0]!.net, black: p.pins[1]!.net, power: 'off', lifted });
  };
  /**
   * The part itself off the board, on its own pins: Ω by default, diode (red on the anode) for a diode; the part
   * is lifted if it was not yet.
   */
  const measureAlone = (part: string, change: { mode?: MeterModeName; red?: string; black?: string } = {}) => {
    const p = liftable.find((x) => x.id === part);
    if (!p || p.pins.length < 2) return;
    const withPart = lifted.includes(part) ? lifted : [...lifted, part].sort();
    if (withPart !== lifted) setLifted(withPart);
    const same = target?.alone === part ? target : undefined;
    const diode = DIODE_KINDS.has(kindOf(part));
    const anode = p.pins.find((x) => x.word === 'anode') ?? p.pins[0]!;
    const other = p.pins.find((x) => x.net !== anode.net) ?? p.pins[1]!;
    const mode = change.mode ?? same?.mode ?? (diode ? 'diode' : 'ohm');
    setTarget({
      mode: mode === 'dcv' ? 'ohm' : mode,
      red: change.red ?? same?.red ?? anode.net,
      black: change.black ?? same?.black ?? other.net,
      power: 'off',
      lifted: withPart,
      alone: part,
    });
  };
  const changeLifted = (next: string[]) => {
    setLifted(next);
    if (!target) return;
    // Putting the measured part back ends its measurement on its own pins.
    if (target.alone && !next.includes(target.alone)) return setTarget(null);
    setTarget({ ...target, lifted: next, ...(next.length ? { power: 'off' as const, mode: target.mode === 'dcv' ? ('ohm' as const) : target.mode } : {}) });
  };
  const chooseRow = (r: ExpectedReadingRow) =>
    setTarget({ mode: r.mode, red: r.red, black: r.black, power: r.power, lifted: r.lifted, pointId: target?.pointId });
  const chooseTest = (t: { target: Target; pointId?: string }) => setTarget({ ...t.target, pointId: t.pointId });
  const pickPart = (p: string) => setSelectedPart((s) => (s === p ? null : p));

  return { target, active, lifted, liftable, selectedPart, selectPoint, measurePads, measureAlone, changeLifted, chooseRow, chooseTest, pickPart };
}
