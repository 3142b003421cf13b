// What proves a repaired board good: a short checklist chosen from the expected-readings table (the readings of
// the repaired part's section, and the main rails that feed it) and one functional check. The sign-off on the
// server and the verification screen both use this list, so a lead signs off exactly what the bench was shown.
import type { BoardModel } from './board-model';
import { boardWords } from './board-words';
import type { ExpectedReadingRow } from './boards';

type ChecklistModel = Pick<BoardModel, 'parts' | 'testPoints' | 'motor' | 'connectors'>;

export interface VerificationChecklist {
  /** Rows of the expected table to measure, in table order. */
  rows: ExpectedReadingRow[];
  /** The functional check the lead confirms at sign-off. */
  functionalCheck: string;
}

const MAX_ROWS = 8;
const lower = (s: string) => s.trim().toLowerCase();

/**
 * The checklist for a board repaired at `part` (a designator or netlist element). Rows: for each test point of
 * the part's section its powered DC V and its unpowered Ω (no part lifted), then the powered DC V of the main
 * rails (test points with a sourced band), up to eight rows. A part the model does not place gives the rails only.
 */
export function verificationChecklist(model: ChecklistModel | null, table: readonly ExpectedReadingRow[], part: string | null): VerificationChecklist {
  // Proposed by designator as printed ("U1") or by netlist element ("XU1"): either finds the part.
  const named = (x: ChecklistModel['parts'][number]) =>
    [x.designator, x.element ?? '', boardWords({ parts: [x], testPoints: [], connectors: [], nets: [] }).designator(x.designator)].map(lower);
  const p = part ? model?.parts.find((x) => named(x).includes(lower(part))) : undefined;
  const points = model?.testPoints ?? [];
  const inSection = new Set(points.filter((t) => p && t.section === p.section).map((t) => lower(t.id)));
  const rails = new Set(points.filter((t) => t.band !== undefined).map((t) => lower(t.id)));
  const plain = table.filter((r) => r.lifted.length === 0);
  const pick = (ids: Set<string>, ok: (r: ExpectedReadingRow) => boolean) => plain.filter((r) => ids.has(lower(r.red)) && ok(r));
  const chosen = [
    ...pick(inSection, (r) => r.mode === 'dcv' && r.power === 'on'),
    ...pick(inSection, (r) => r.mode === 'ohm' && r.power === 'off'),
    ...pick(rails, (r) => r.mode === 'dcv' && r.power === 'on'),
  ];
  const rows = [...new Map(chosen.map((r) => [r.id, r])).values()].slice(0, MAX_ROWS);
  const motor = model?.motor?.connector;
  const functionalCheck = motor
    ? `Powered with the motor on ${motor}: the fan motor starts and runs at the commanded speed, and the unit's fault code does not return`
    : "Powered in the unit or on the test jig: the board does what the customer's symptom said it did not, and the fault code does not return";
  return { rows, functionalCheck };
}

interface VerificationReading {
  mode: string;
  red: string;
  black: string;
  redNet: string;
  blackNet: string;
  power: string;
  lifted: readonly string[];
  verdict: { verdict: string } | null;
}

/**
 * Which checklist rows are not proven yet by the verification readings given (current ones, taken after the last
 * repair, newest last). A row is proven by its newest matching reading being healthy. `netOf` resolves a row's
 * test point id to its net.
 */
export function unprovenRows<R extends VerificationReading>(
  rows: readonly ExpectedReadingRow[],
  readings: readonly R[],
  netOf: (p: string) => string,
): { row: ExpectedReadingRow; latest: R | undefined }[] {
  return rows
    .map((row) => {
      const latest = [...readings]
        .reverse()
        .find(
          (r) =>
            r.mode === row.mode &&
            r.power === row.power &&
            r.lifted.length === 0 &&
            lower(r.redNet) === lower(netOf(row.red)) &&
            lower(r.blackNet) === lower(netOf(row.black)),
        );
      return { row, latest };
    })
    .filter((x) => x.latest?.verdict?.verdict !== 'ok');
}
