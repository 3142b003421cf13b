import { migrate } from 'drizzle-orm/node-postgres/migrator';
import { fileURLToPath } from 'node:url';
import type { Db } from './client';

export const MIGRATIONS_DIR = fileURLToPath(new URL('../../../../drizzle', import.meta.url));

/** Applies the committed migrations under drizzle/; throws on failure so the caller exits non-zero. */
export async function runMigrations(db: Db): Promise<void> {
  await migrate(db, { migrationsFolder: MIGRATIONS_DIR });
}
