// `pnpm dictionary:build [--board <id, key or name>]`: builds the fault dictionaries that stored board versions
// lack (those published before dictionaries existed, or computed by an older engine), one after another in the
// builder thread, and says what it did. The claim in the database keeps a running server from building the same
// version at the same time.
import { createDatabase } from '../../db/client';
import { dictionaryBuildsIdle, dictionaryState, enableDictionaryBuilds, ensureDictionary, versionsLackingDictionary } from './dictionary';

export async function buildMissingDictionaries(url: string, board: string | undefined, log: (line: string) => void): Promise<number> {
  const { db, pool } = createDatabase(url, 4);
  try {
    enableDictionaryBuilds(true);
    const versions = await versionsLackingDictionary(db, board);
    if (versions.length === 0) log(board ? `no version of "${board}" lacks a fault dictionary` : 'every board version has its fault dictionary');
    let failed = 0;
    for (const v of versions) {
      const t0 = performance.now();
      await ensureDictionary(db, v.id);
      await dictionaryBuildsIdle();
      const s = await dictionaryState(db, v.id);
      const secs = ((performance.now() - t0) / 1000).toFixed(1);
      if (s.state === 'ready') log(`${v.board} v${v.version}: fault dictionary ready (${s.partsTotal} parts, ${secs} s)`);
      else if (s.state === 'building') log(`${v.board} v${v.version}: another process is building it (${s.partsDone} / ${s.partsTotal} parts)`);
      else {
        failed++;
        log(`${v.board} v${v.version}: fault dictionary ${s.state}`);
      }
    }
    return failed === 0 ? 0 : 1;
  } finally {
    await pool.end();
  }
}
