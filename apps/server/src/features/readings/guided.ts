// Trainees record readings in guided order (unless a lead lifted it): the reading must be one of the steps the
// diagnosis engine gives next. Every unpowered reading on a section that touches the bus needs the discharge gate
// passed first, whoever takes it. The bench screen enforces the same; this is the server's half, so a hand-made
// request cannot skip a step or the gate.
import { dischargeGateRefusal, isPhotoOnlyBoard, type CreateReadingInput, type GateModel } from '@splitscope/contract';
import { DEFAULT_SAFE_THRESHOLD } from '@splitscope/boards';
import type { Db } from '../../db/client';
import type { jobs } from '../../db/schema';
import { AppError } from '../../http/errors';
import { normNode as norm } from '@splitscope/circuit';
import { LRUCache } from 'lru-cache';
import { readBoardModel } from '../boards';
import { computeDiagnosis } from '../diagnosis';

const sameSet = (a: readonly string[], b: readonly string[]) => a.length === b.length && a.every((x) => b.some((y) => norm(x) === norm(y)));

// The gate model (test points and sections) of a version, parsed once: a version never changes. Null when the
// document cannot be read, which gates every unpowered reading. This module is the cache's only user; lru-cache
// keeps the 200 versions used last (a few kB each) and stores no null, hence the box.
const gateModels = new LRUCache<string, { model: GateModel | null }>({ max: 200 });
async function gateModelOf(versionId: string, loadDocument: () => Promise<unknown>): Promise<GateModel | null> {
  const hit = gateModels.get(versionId);
  if (hit) return hit.model;
  let model: GateModel | null = null;
  try {
    const m = readBoardModel(await loadDocument());
    // A board that is its photo only (no sections, no parts) says nothing about where the bus is: it stays null.
    if (!isPhotoOnlyBoard(m)) model = { testPoints: m.testPoints, sections: m.sections };
  } catch {
    // An unreadable document leaves the model null, which gates every unpowered reading.
  }
  gateModels.set(versionId, { model });
  return model;
}

const gateApplies = (input: Pick<CreateReadingInput, 'power'>) => input.power === 'off';

/**
 * The bus-discharge gate, as the server checks it for every role and phase: the contract's rule, refused with
 * the words that say what to do.
 */
export async function checkSafetyGate(versionId: string, loadDocument: () => Promise<unknown>, input: CreateReadingInput): Promise<void> {
  if (!gateApplies(input)) return;
  const why = dischargeGateRefusal(await gateModelOf(versionId, loadDocument), input, DEFAULT_SAFE_THRESHOLD);
  if (why) throw new AppError('invalid', why, { errors: [{ path: 'safetyCheck', message: why }] });
}

interface Probe {
  redNet: string;
  blackNet: string;
  lifted: string[];
}
type Test = Probe & { mode: string; power: string };
const sameTest = (a: Test, b: Test) =>
  a.mode === b.mode && a.power === b.power && norm(a.redNet) === norm(b.redNet) && norm(a.blackNet) === norm(b.blackNet) && sameSet(a.lifted, b.lifted);

/**
 * Refuses a trainee's reading that is not one of the engine's next steps for this job. A correction of a step
 * already taken (same probes, same meter function, same state) is allowed: fixing a typo is not skipping ahead.
 */
export async function checkGuidedStep({
  db,
  job,
  input,
  probe,
  corrects,
}: {
  db: Db;
  job: Pick<typeof jobs.$inferSelect, 'id' | 'boardVersionId'>;
  input: CreateReadingInput;
  probe: Probe;
  corrects?: Test;
}): Promise<void> {
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
