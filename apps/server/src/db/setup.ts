import { loadConfig } from '../config';
import { upgradeBoardDocuments } from '../features/boards/upgrade';
import { DiskStorage } from '../storage/storage';
import { createDatabase } from './client';
import { runMigrations } from './migrate';
import { seedDemo } from './seed';

/** Migrations, then the idempotent demo seed: what `npm start` and `npm test` run before the server. */
export async function migrateAndSeed(url: string): Promise<{ created: number }> {
  const { db, pool } = createDatabase(url, 2);
  try {
    await runMigrations(db);
    // Stored board documents are brought to the current schema before the seed reads any (see boards/upgrade.ts).
    await upgradeBoardDocuments({ db, storage: new DiskStorage(loadConfig({ ...process.env, DATABASE_URL: url }).UPLOAD_DIR) });
    return await seedDemo(db);
  } finally {
    await pool.end();
  }
}
