// The expected-readings table a job's screens read: the board version's table computed for the meter the job is
// read with (contract: jobMeter), since an Ω or diode value through a junction depends on the meter's test current.
import { eq } from 'drizzle-orm';
import { jobMeter, type BoardDetail, type ExpectedReadingRow, type JobMeter } from '@splitscope/contract';
import type { Db } from '../../db/client';
import { shops } from '../../db/schema';
import { boardEngine, expectedTableFor } from '../boards';

interface JobMeterFields {
  shopId: string;
  boardVersionId: string;
  meterProfile: string | null;
}

/** The job's meter and its board's expected table for that meter (the stored one when no meter is chosen). */
export async function jobMeterTable(
  db: Db,
  job: JobMeterFields,
  board: Pick<BoardDetail, 'document' | 'expectedReadings' | 'modelProblem'>,
): Promise<{ meter: JobMeter; expectedReadings: ExpectedReadingRow[] }> {
  const [shop] = await db.select({ meterProfile: shops.meterProfile }).from(shops).where(eq(shops.id, job.shopId));
  const meter = jobMeter(job.meterProfile, shop?.meterProfile);
  // A version whose stored model cannot be read judges nothing: it has no table to compute for any meter.
  if (!meter.profile || board.modelProblem) return { meter, expectedReadings: board.expectedReadings };
  // The engine of a stored version is built once per process (the reading route uses the same one).
  const engine = boardEngine(job.boardVersionId, board.document, board.expectedReadings);
  return { meter, expectedReadings: expectedTableFor(engine, meter.profile) };
}
