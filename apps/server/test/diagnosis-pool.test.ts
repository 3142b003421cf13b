// The diagnosis threads on their own, without a server or database: a board document crosses to a thread once,
// the engine's errors keep their meaning across it, and a thread that dies fails only its pending call.
import { afterEach, describe, expect, it } from 'vitest';
import type { Worker } from 'node:worker_threads';
import type { CaseReading } from '@splitscope/diagnosis';
import { buildBoardEngine } from '../src/features/boards/engine';
import { DiagnosisPool, spawnDiagnosisWorker } from '../src/features/diagnosis/pool';
import { AppError } from '../src/http/errors';
import { DIVIDER_BOARD } from '../src/testing/factories';

// 15 V over 10k/10k; the lower half reads low, so the ranking has something to say.
const readings: CaseReading[] = [{ mode: 'dcv', red: 'mid', black: '0', power: 'on', value: 2.1 }];
const pools: DiagnosisPool[] = [];
afterEach(async () => {
  await Promise.all(pools.splice(0).map((p) => p.close()));
});

/** A one-thread pool whose threads the test can reach, and a document loader that counts its calls. */
function setup(onPost?: (worker: Worker) => void) {
  const workers: Worker[] = [];
  const pool = new DiagnosisPool({
    size: 1,
    spawn: () => {
      const w = spawnDiagnosisWorker();
      const post = w.postMessage.bind(w);
      w.postMessage = (m: unknown) => {
        post(m);
        onPost?.(w);
      };
      workers.push(w);
      return w;
    },
  });
  pools.push(pool);
  const loads = { count: 0 };
  const load = async () => {
    loads.count++;
    return DIVIDER_BOARD;
  };
  return { pool, workers, loads, load };
}

describe('diagnosis threads', () => {
  it('answer what the engine gives in-process, loading the board document once per thread', async () => {
    const { pool, loads, load } = setup();
    const first = await pool.run('v-divider', readings, load);
    const again = await pool.run('v-divider', [...readings, { mode: 'dcv', red: 'in', black: '0', power: 'on', value: 15 }], load);
    expect(loads.count).toBe(1);
    expect(first).toEqual(buildBoardEngine('v-divider', DIVIDER_BOARD).diagnoser.update(readings));
    expect(again.readings).toHaveLength(2);
  }, 120_000);

  it("keep the engine's refusal a 409 and judge nothing on a stored board the schema rejects", async () => {
    const { pool, load } = setup();
    const refused = await pool.run('v-divider', [{ mode: 'dcv', red: 'nowhere', black: '0', power: 'on', value: 1 }], load).catch((e: unknown) => e);
    expect(refused).toBeInstanceOf(AppError);
    expect((refused as AppError).status).toBe(409);
    expect((refused as AppError).detail).toMatch(/^The diagnosis engine cannot use these readings: .*nowhere/);
    // A stored document the schema rejects opens as a board of its photo only: readings recorded, none judged
    // (boards/engine.ts boardEngine), until a lead corrects the model.
    const unusable = await pool.run('v-empty', readings, async () => ({ id: 'no-netlist' }));
    expect(unusable.readings).toEqual([]);
  }, 120_000);

  it('a thread that dies rejects its pending call; the next call starts a new thread and sends it the document again', async () => {
    let kill = true;
    // Stopped the moment the call is posted: it is still loading its modules, so it cannot have answered.
    const { pool, workers, loads, load } = setup((w) => {
      if (kill) void w.terminate();
      kill = false;
    });
    await expect(pool.run('v-divider', readings, load)).rejects.toThrow(/diagnosis worker stopped/);
    const after = await pool.run('v-divider', readings, load);
    expect(after.readings[0]?.verdict).toBe('low');
    expect(workers).toHaveLength(2);
    expect(loads.count).toBe(2);
  }, 120_000);

  it('rejects calls once closed', async () => {
    const { pool, load } = setup();
    await pool.close();
    await expect(pool.run('v-divider', readings, load)).rejects.toThrow(/stopped/);
  });
});
