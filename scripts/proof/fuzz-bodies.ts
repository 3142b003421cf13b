// Field values that open the bench routes' valid space: a reading is only accepted on probe places the job's
// board model has, in a meter function that fits the power state, with a value in that function's range and,
// unpowered on the bus, with the discharge check. The contract schema still generates every other field; these
// are the fields whose valid values depend on each other and on the board, so they are drawn together from a row
// of the board's expected table.
import fc from 'fast-check';
import { createReadingRequest, ohmsSchema, unitOf, voltsSchema } from '../../packages/contract/src/index';
import type { BoardDetail, ExpectedReadingRow } from '../../packages/contract/src/index';
import { validArb, type Ids } from './zod-arb';
import { placeholder } from './fuzz-fresh';

type Row = ExpectedReadingRow;

/** A value in the meter function's range (volts for DC V and diode, ohms for Ω and continuity), or OL. */
const valueArb = (r: Row) =>
  fc.oneof({ weight: 5, arbitrary: validArb(unitOf(r.mode) === 'V' ? voltsSchema : ohmsSchema) }, { weight: 1, arbitrary: fc.constant('OL') });

/** The bus discharge check an unpowered reading needs on a section that touches the bus: unplugged, a few volts left. */
const safetyArb = fc.record({ unplugged: fc.constant(true), busVolts: fc.double({ min: -5, max: 5, noNaN: true }) });

/** The probe fields of one expected-table row, pinned for the schema's generator. */
const probeOf = (r: Row): Ids => ({
  mode: fc.constant(r.mode),
  red: fc.constant(r.red),
  black: fc.constant(r.black),
  power: fc.constant(r.power),
  lifted: fc.constant(r.lifted),
  value: valueArb(r),
});

/** A reading of the board as the bench sends it: a plain one, or in one in four a correction of the route's fresh reading. */
function readingArb(rows: Row[]): fc.Arbitrary<unknown> {
  return fc.constantFrom(...rows).chain((r) =>
    fc
      .tuple(
        validArb(createReadingRequest, 0, {
          ...probeOf(r),
          alone: fc.constant(undefined),
          phase: fc.constant('diagnosis'),
          supersedes: fc.constantFrom(undefined, undefined, undefined, placeholder('supersedes')),
        }),
        safetyArb,
      )
      .map(([body, safetyCheck]) => (r.power === 'off' ? { ...(body as object), safetyCheck } : { ...(body as object), safetyCheck: undefined })),
  );
}

type ZodSchema = object;

/**
 * The well-formed bodies of a bench route, from the board the set-ups open their jobs on: the schema's generator
 * with the fields that depend on the board (or on each other) pinned. Null for a route with nothing to pin.
 */
export function benchValid(name: string, schema: ZodSchema, ids: Ids, board: BoardDetail, customerEmail: string): fc.Arbitrary<unknown> | null {
  // a reference is one good board's readings; continuity and readings with a part lifted are not kept
  const kept = board.expectedReadings.filter((r) => r.mode !== 'continuity' && r.lifted.length === 0);
  const pinned = (fields: Ids) => validArb(schema, 0, { ...ids, ...fields });
  switch (name) {
    case 'POST /api/jobs/:id/readings':
      return readingArb(board.expectedReadings);
    case 'POST /api/boards/:id/references':
      return pinned({
        readings: fc.array(
          fc.constantFrom(...kept).chain((r) => fc.record({ ...probeOf(r), lifted: fc.constant(undefined) })),
          { minLength: 1, maxLength: 4 },
        ),
      });
    case 'POST /api/jobs/:id/repairs':
      // pictures and bin drawers are routes of their own: a repair here names the board's part and no drawer
      return pinned({ part: fc.constantFrom(...board.document.parts.map((p) => p.designator)), uploadIds: fc.constant([]), binPartId: fc.constant(undefined) });
    case 'POST /api/jobs/:id/meter-import/preview':
    case 'POST /api/jobs/:id/meter-import':
      // the log of the set-up's meter profile (columns Point, Reading; DC V, powered): a few rows on the board's points
      return pinned({
        profileId: fc.constant(placeholder('profileId')),
        csv: fc
          .array(fc.constantFrom(...board.expectedReadings.filter((r) => r.mode === 'dcv' && r.power === 'on' && r.lifted.length === 0)), {
            minLength: 1,
            maxLength: 6,
          })
          .chain((rows) => fc.tuple(...rows.map((r) => fc.tuple(fc.constant(r.red), validArb(voltsSchema) as fc.Arbitrary<number>))))
          .map((rows) => ['Point,Reading', ...rows.map(([point, v]) => `${point},${v.toFixed(3)}`)].join('\n')),
        phase: fc.constant('diagnosis'),
        bindings: fc.constant({}),
        safetyCheck: fc.constant(undefined),
      });
    case 'POST /api/jobs/:jobId/invoices':
      // an invoice of the job's approved quote, as the shop issues one
      return pinned({ quoteId: fc.constant(placeholder('quoteId')), lines: fc.constant(undefined) });
    case 'POST /api/invoices/:id/send':
    case 'POST /api/quotes/:id/send':
    case 'POST /api/jobs/:jobId/notify':
      // a customer link goes to the customer's address on file, or is refused (hole 5)
      return pinned({ to: fc.constantFrom(customerEmail, undefined) });
    case 'GET /api/bench-meter/next':
    case 'GET /api/jobs/:id/bench-meter':
      // a long poll holds its answer up to `wait` seconds: 0–1 s keeps a run's time on payloads, not on waiting
      return pinned({ wait: fc.constantFrom(0, 1) });
    default:
      return null;
  }
}
