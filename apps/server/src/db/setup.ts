import { loadConfig } from '../config';
import { upgradeBoardDocuments } from '../features/boards/upgrade';
import { DiskStorage } from '../storage/storage';
import { createDatabase } from './client';
import { runMigrations } from './migrate';
import { seedDemo } from './seed';

/**
 * Migrations, then in demo mode the idempotent demo seed: what `npm start` and `npm test` run before the server.
 * A real shop (`shop` mode) gets no seed: it starts empty and is set up on the first-run page.
 */
export async function migrateAndSeed(url: string, mode: 'demo' | 'shop' = 'demo'): Promise<{ created: number; seeded: boolean }> {
  const { db, pool } = createDatabase(url, 2);
  try {
    await runMigrations(db);
    // Stored board documents are brought to the current schema before the seed reads any (see boards/upgrade.ts).
    const storage = new DiskStorage(loadConfig({ ...process.env, DATABASE_URL: url }).UPLOAD_DIR);
    await upgradeBoardDocuments({ db, storage });
    if (mode === 'shop') return { created: 0, seeded: false };
    return { ...(await seedDemo(db, storage)), seeded: true };
  } finally {
    await pool.end();
  }
}
