// The stored job of the actor's shop: the one lookup every feature that works on a job starts from. It lives
// beside the schema, below the features, so that a feature needing the row does not import the jobs feature
// (which itself uses diagnosis, boards and reviews) and no feature cycle forms.
import { and, eq } from 'drizzle-orm';
import { AppError } from '../http/errors';
import type { Db } from './client';
import { jobs } from './schema';

export type JobRow = typeof jobs.$inferSelect;

/** A job of the actor's shop, or 404: another shop's ids look exactly like unknown ones. */
export async function getJobRow(db: Db, shopId: string, id: string, lock = false): Promise<JobRow> {
  const q = db
    .select()
    .from(jobs)
    .where(and(eq(jobs.id, id), eq(jobs.shopId, shopId)));
  const [row] = lock ? await q.for('update') : await q;
  if (!row) throw new AppError('not_found', `No job ${id}`);
  return row;
}
