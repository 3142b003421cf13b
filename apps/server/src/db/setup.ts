import { createDatabase } from './client';
import { runMigrations } from './migrate';
import { seedDemo } from './seed';

/** Migrations, then the idempotent demo seed: what `npm start` and `npm test` run before the server. */
export async function migrateAndSeed(url: string): Promise<{ created: number }> {
  const { db, pool } = createDatabase(url, 2);
  try {
    await runMigrations(db);
    return await seedDemo(db);
  } finally {
    await pool.end();
  }
}
