import {
  acceptsReadings,
  createReadingRequest,
  instrumentName,
  jobStatusLabels,
  mayServeBenchMeterArm,
  METER_WORDS,
  readingSchema,
  readScpiNumber,
  SCPI_CONFIGURE,
  SCPI_TRIGGER_SOURCE,
  statusesTakingReadings,
  type BenchMeterArm,
  type BenchMeterJob,
  type BenchMeterStatus,
  type ArmBenchMeterInput,
  type BenchMeterReadingInput,
  type CreateReadingResponse,
} from '@splitscope/contract';
import type { Actor } from '../../auth/guards';
import type { Db } from '../../db/client';
import { getJobRow } from '../../db/job-row';
import { AppError } from '../../http/errors';
import { iso } from '../../lib/dates';
import { newId } from '../../lib/ids';
import { eq } from 'drizzle-orm';
import { boardEngine, cachedBoardEngine, powerRefusal, resolveNet, verdictFor } from '../boards';
import { boardModelVersions } from '../../db/schema';
import { createReading } from '../readings';
import type { Arm, MeterDesk } from './desk';

const shown = (a: Arm): BenchMeterArm => ({
  id: a.id,
  jobId: a.jobId,
  mode: a.mode,
  red: a.red,
  black: a.black,
  power: a.power,
  lifted: a.lifted,
  phase: a.phase,
  trigger: a.trigger,
  armedAt: a.armedAt,
  state: a.state,
  ready: a.ready,
  reading: a.reading,
  refusal: a.refusal,
});

/**
 * Asks the signed-in person's bench meter for one reading of this test. Refused at once where the reading write
 * would refuse it for the job or the meter function alone; the rest (guided order, the discharge gate, the value)
 * is judged when the meter answers, by the reading write itself.
 */
export async function armBenchMeter({
  db,
  desk,
  actor,
  jobId,
  input,
}: {
  db: Db;
  desk: MeterDesk;
  actor: Actor;
  jobId: string;
  input: ArmBenchMeterInput;
}): Promise<BenchMeterArm> {
  const job = await getJobRow(db, actor.shopId, jobId);
  if (!acceptsReadings(job.status, input.phase)) {
    throw new AppError(
      'conflict',
      `A ${input.phase} reading is taken while the job is ${statusesTakingReadings(input.phase).join(' or ')}; this job is ${jobStatusLabels[job.status].toLowerCase()}`,
    );
  }
  const why = powerRefusal(input.mode, input.power);
  if (why) throw new AppError('invalid', why, { errors: [{ path: 'power', message: why }] });
  const arm: Arm = {
    id: newId(),
    jobId,
    userId: actor.id,
    shopId: actor.shopId,
    ...input,
    armedAt: iso(new Date()),
    state: 'waiting',
    ready: false,
    reading: null,
    refusal: null,
  };
  desk.arm(arm);
  void prepareVerdict(db, job.boardVersionId, arm)
    .catch(() => undefined)
    .finally(() => {
      arm.ready = true;
      desk.touch(actor.id);
    });
  return shown(arm);
}

/**
 * While the technician places the probes, builds the board's engine and the healthy band of the armed test (both
 * kept per process), so the write at the meter's trigger does not pay for the first solve: on a busy 2-core
 * machine that was 1.4 s of the trigger-to-bench time, against 0.14-0.2 s once built. A failure here only means
 * the write builds them itself.
 */
async function prepareVerdict(db: Db, versionId: string, arm: Arm): Promise<void> {
  let engine = cachedBoardEngine(versionId);
  if (!engine) {
    const [v] = await db
      .select({ document: boardModelVersions.document, expectedReadings: boardModelVersions.expectedReadings })
      .from(boardModelVersions)
      .where(eq(boardModelVersions.id, versionId));
    if (!v) return;
    engine = boardEngine(versionId, v.document, v.expectedReadings);
  }
  const red = resolveNet(engine, arm.red);
  const black = resolveNet(engine, arm.black);
  if (red && black && arm.lifted.length === 0) verdictFor(engine, { mode: arm.mode, red, black, power: arm.power, lifted: [] }, null);
}

export async function cancelBenchMeter({ db, desk, actor, jobId }: { db: Db; desk: MeterDesk; actor: Actor; jobId: string }): Promise<BenchMeterStatus> {
  await getJobRow(db, actor.shopId, jobId);
  desk.cancel(actor.id, jobId);
  return benchMeterStatus({ db, desk, actor, jobId });
}

/**
 * This person's latest request on the job and their bridge. With `wait`, and while the request the page shows
 * (`since`: its id and state) is still as shown, the answer waits up to `wait` ms for it to change: the bench hears
 * of the meter's reading the moment it is stored, not at its next poll.
 */
export async function benchMeterStatus({
  db,
  desk,
  actor,
  jobId,
  since,
  waitMs = 0,
  signal,
}: {
  db: Db;
  desk: MeterDesk;
  actor: Actor;
  jobId: string;
  since?: string;
  waitMs?: number;
  signal?: AbortSignal;
}): Promise<BenchMeterStatus> {
  await getJobRow(db, actor.shopId, jobId);
  const shownNow = (a: Arm | undefined) => (a ? `${a.id}:${a.state}:${a.ready}` : 'none');
  if (waitMs > 0 && signal && since === shownNow(desk.latestOnJob(actor.id, jobId))) await desk.changed(actor.id, waitMs, signal);
  const arm = desk.latestOnJob(actor.id, jobId);
  const bridge = desk.bridgeOf(actor.id);
  return { arm: arm ? shown(arm) : null, bridge: bridge ? { instrument: bridge.instrument, seenAt: iso(bridge.seenAt), connected: bridge.connected } : null };
}

/** The request the person's bridge is to serve next, in the SCPI commands that set the meter up for it. */
export async function nextBenchMeterJob({
  desk,
  actor,
  after,
  waitMs,
  instrument,
  signal,
}: {
  desk: MeterDesk;
  actor: Actor;
  after?: string;
  waitMs: number;
  instrument?: string;
  signal: AbortSignal;
}): Promise<BenchMeterJob | null> {
  desk.seen(actor.id, instrument ? instrumentName(instrument) : undefined);
  const arm = await desk.next(actor.id, after, waitMs, signal);
  if (!arm) return null;
  const lifted = arm.lifted.length ? `, ${arm.lifted.join(', ')} lifted` : '';
  return {
    id: arm.id,
    mode: arm.mode,
    configure: SCPI_CONFIGURE[arm.mode],
    triggerSource: SCPI_TRIGGER_SOURCE[arm.trigger],
    trigger: arm.trigger,
    label: `${arm.red} ${METER_WORDS[arm.mode]}, black on ${arm.black}, board ${arm.power === 'on' ? 'powered' : 'unplugged'}${lifted}`,
  };
}

/**
 * The meter's answer for a request, stored through the bench's own reading write: the same validation, verdict,
 * guided order and discharge gate as a typed reading. An answer that is not a number the SCPI rules define is
 * refused and never stored. The request ends either way (taken or refused) and the bench shows which; an answer
 * sent again for a request already taken returns the same reading.
 */
export async function takeBenchMeterReading({
  db,
  desk,
  actor,
  armId,
  input,
}: {
  db: Db;
  desk: MeterDesk;
  actor: Actor;
  armId: string;
  input: BenchMeterReadingInput;
}): Promise<CreateReadingResponse> {
  const arm = desk.find(actor.id, armId);
  if (!arm || !mayServeBenchMeterArm(actor, arm)) throw new AppError('not_found', `No bench-meter request ${armId} of yours`);
  const instrument = input.instrument ? instrumentName(input.instrument) : 'bench meter';
  desk.seen(actor.id, input.instrument ? instrument : undefined);
  const value = readScpiNumber(input.answer);
  const reading = value.ok
    ? createReadingRequest.safeParse({
        idempotencyKey: `bench-meter:${arm.id}`,
        mode: arm.mode,
        red: arm.red,
        black: arm.black,
        power: arm.power,
        lifted: arm.lifted,
        value: value.value,
        raw: input.answer,
        instrument,
        phase: arm.phase,
        ...(arm.safetyCheck ? { safetyCheck: arm.safetyCheck } : {}),
      })
    : null;
  if (arm.state === 'cancelled') throw new AppError('conflict', 'This request was cancelled on the bench: nothing stored');
  if (arm.state === 'refused') throw new AppError('conflict', `This request was already refused: ${arm.refusal}`);
  const refuse = (message: string, path: string) => {
    desk.settle(arm, { refusal: message });
    return new AppError('invalid', message, { errors: [{ path, message }] });
  };
  if (!value.ok) throw refuse(`Not stored: ${value.error}.`, 'answer');
  if (!reading?.success) throw refuse(`Not stored: ${reading?.error.issues.map((i) => `${i.path.join('.')} ${i.message}`).join('; ')}`, 'answer');
  try {
    const saved = await createReading({ db, actor, jobId: arm.jobId, input: reading.data });
    if (arm.state === 'waiting') desk.settle(arm, { reading: readingSchema.parse(saved) });
    return saved;
  } catch (err) {
    // A refusal ends the request; the server or database being down does not: the bridge sends the answer again.
    if (err instanceof AppError && err.status < 500) desk.settle(arm, { refusal: err.message });
    throw err;
  }
}
