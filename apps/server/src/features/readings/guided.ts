// Trainees record readings in guided order only: the reading must be one of the steps the diagnosis engine
// gives next, and an unpowered step on a section that touches the bus needs the discharge gate passed first.
// The bench screen enforces the same; this is the server's half, so a hand-made request cannot skip a step.
import { boardModelSchema, probesTouchBus, type CreateReadingInput } from '@splitscope/contract';
import { DEFAULT_SAFE_THRESHOLD } from '@splitscope/boards';
import type { Db } from '../../db/client';
import type { jobs } from '../../db/schema';
import { AppError } from '../../http/errors';
import { normNet as norm } from '../boards';
import { computeDiagnosis } from '../diagnosis';

const sameSet = (a: readonly string[], b: readonly string[]) => a.length === b.length && a.every((x) => b.some((y) => norm(x) === norm(y)));

/** The bus-discharge gate, as the server checks it: refused with a message naming what is missing. */
export function checkSafetyGate(document: unknown, input: CreateReadingInput): void {
  if (input.power !== 'off') return;
  const model = boardModelSchema.safeParse(document);
  // A model the schema cannot read says nothing about where the bus is: gate everything.
  const touches = model.success ? probesTouchBus(model.data, input.red, input.black) : true;
  if (!touches) return;
  const limit = DEFAULT_SAFE_THRESHOLD.volts;
  const path = [{ path: 'safetyCheck', message: '' }];
  if (!input.safetyCheck) {
    const message = `This unpowered step is on a section that touches the DC bus: confirm the board is unplugged and enter the bus voltage measured now (below ${limit} V, ${DEFAULT_SAFE_THRESHOLD.standard}) first`;
    throw new AppError('invalid', message, { errors: [{ ...path[0]!, message }] });
  }
  if (input.safetyCheck.busVolts >= limit) {
    const message = `The bus still reads ${input.safetyCheck.busVolts} V, not below ${limit} V: wait for it to bleed down or discharge it through a rated resistor, then measure again`;
    throw new AppError('invalid', message, { errors: [{ ...path[0]!, message }] });
  }
}

interface Probe {
  redNet: string;
  blackNet: string;
  lifted: string[];
}
type Test = Probe & { mode: string; power: string };
const sameTest = (a: Test, b: Test) => a.mode === b.mode && a.power === b.power && norm(a.redNet) === norm(b.redNet) && norm(a.blackNet) === norm(b.blackNet) && sameSet(a.lifted, b.lifted);

/**
 * Refuses a trainee's reading that is not one of the engine's next steps for this job. A correction of a step
 * already taken (same probes, same meter function, same state) is allowed: fixing a typo is not skipping ahead.
 */
export async function checkGuidedStep({ db, job, input, probe, corrects }: { db: Db; job: Pick<typeof jobs.$inferSelect, 'id' | 'boardVersionId'>; input: CreateReadingInput; probe: Probe; corrects?: Test }): Promise<void> {
  const taken: Test = { ...probe, mode: input.mode, power: input.power };
  if (corrects) {
    if (sameTest(taken, corrects)) return;
    throw new AppError('conflict', 'Guided order: a correction repeats the step it corrects (same probes, meter function and power state)');
  }
  const { nextTests } = await computeDiagnosis({ db, job });
  const first = nextTests[0];
  if (!first) throw new AppError('conflict', 'Guided order: the engine has no further step for this job; ask your lead to look at the ranking');
  if (!nextTests.some((t) => sameTest(taken, { ...t, redNet: t.red, blackNet: t.black }))) {
    throw new AppError('conflict', `Guided order: trainees record the step the engine gives next. Next step: ${first.instruction}`);
  }
}
