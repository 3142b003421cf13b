// The diagnosis threads on their own, without a server or database: a board document crosses to a thread once,
// the engine's errors keep their meaning across it, and a thread that dies fails only its pending call.
import { afterEach, describe, expect, it } from 'vitest';
import type { CaseReading } from '@splitscope/diagnosis';
import { buildBoardEngine } from '../src/features/boards/engine';
import { DiagnosisPool } from '../src/features/diagnosis/pool';
import { AppError } from '../src/http/errors';
import { DIVIDER_BOARD } from '../src/testing/factories';

// 15 V over 10k/10k; the lower half reads low, so the ranking has something to say.
const readings: CaseReading[] = [{ mode: 'dcv', red: 'mid', black: '0', power: 'on', value: 2.1 }];
const pools: DiagnosisPool[] = [];
afterEach(async () => {
  await Promise.all(pools.splice(0).map((p) => p.close()));
});

/** A pool of `size` threads, and a document loader that counts its calls. */
function setup(size = 1) {
  const pool = new DiagnosisPool({ size });
  pools.push(pool);
  const loads = { count: 0 };
  const load = async () => {
    loads.count++;
    return DIVIDER_BOARD;
  };
  return { pool, loads, load };
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

  it('send each board to the thread that holds it: two boards on two threads, each document loaded once', async () => {
    const { pool, loads, load } = setup(2);
    pool.warm();
    const other = { count: 0 };
    const loadOther = async () => {
      other.count++;
      return DIVIDER_BOARD;
    };
    // Both threads are idle at each round; a call sent to the thread without its board would load it again.
    for (let round = 0; round < 4; round++) {
      const [a, b] = await Promise.all([pool.run('v-a', readings, load), pool.run('v-b', readings, loadOther)]);
      expect(a.readings[0]?.verdict).toBe('low');
      expect(b.readings[0]?.verdict).toBe('low');
    }
    expect(pool.workers()).toHaveLength(2);
    expect([loads.count, other.count]).toEqual([1, 1]);
  }, 120_000);

  it('a call that finds the holder busy goes to an idle thread, which asks for the document and answers', async () => {
    const { pool, loads, load } = setup(2);
    pool.warm();
    const first = await pool.run('v-a', readings, load);
    expect(loads.count).toBe(1);
    // Both calls are balanced in the same turn: the first takes the thread that holds the board, the second the
    // idle one, which was sent no document (a thread holds it) and so asks for it.
    const [busy, idle] = await Promise.all([pool.run('v-a', readings, load), pool.run('v-a', readings, load)]);
    expect(loads.count).toBe(2);
    expect(busy).toEqual(first);
    expect(idle).toEqual(first);
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
    const { pool, loads, load } = setup();
    pool.warm();
    const [first] = pool.workers();
    // Stopped once the call is on its way: the thread is still loading its modules, so it cannot have answered.
    const pending = pool.run('v-divider', readings, async () => {
      const doc = await load();
      setTimeout(() => void first!.terminate(), 0);
      return doc;
    });
    await expect(pending).rejects.toThrow(/diagnosis worker stopped/);
    const after = await pool.run('v-divider', readings, load);
    expect(after.readings[0]?.verdict).toBe('low');
    expect(pool.workers()).toHaveLength(1);
    expect(pool.workers()[0]).not.toBe(first);
    expect(loads.count).toBe(2);
  }, 120_000);

  it('rejects calls once closed', async () => {
    const { pool, load } = setup();
    await pool.close();
    await expect(pool.run('v-divider', readings, load)).rejects.toThrow(/stopped/);
  });
});
