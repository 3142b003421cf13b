import type { ReadingVerdict, StoredReading } from '@splitscope/contract';
import { iso } from '../../lib/dates';
import type { ReadingRow } from './write-batch';

// A stored reading as the API gives it: the row, who took it, the correction that replaced it and its strike.
type Struck = StoredReading['struck'];

export function toReading(r: ReadingRow, authorName: string, supersededBy: string | null, struck: Struck = null): StoredReading {
  return {
    id: r.id,
    jobId: r.jobId,
    mode: r.mode,
    red: r.red,
    black: r.black,
    redNet: r.redNet,
    blackNet: r.blackNet,
    power: r.power,
    lifted: r.lifted,
    alone: r.alone,
    value: r.overLimit ? 'OL' : r.value!,
    unit: r.unit as 'V' | 'ohm',
    beep: r.beep,
    raw: r.raw,
    instrument: r.instrument,
    phase: r.phase,
    idempotencyKey: r.idempotencyKey,
    supersedes: r.supersedes,
    supersededBy,
    authorId: r.authorId,
    authorName,
    takenAt: iso(r.takenAt),
    createdAt: iso(r.createdAt),
    verdict: (r.verdict as ReadingVerdict | null) ?? null,
    safetyBusVolts: r.safetyBusVolts,
    struck,
  };
}
