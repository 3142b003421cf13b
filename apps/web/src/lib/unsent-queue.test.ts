import { describe, expect, it } from 'vitest';
import { enqueueUnsent, flushUnsent, loadUnsent, type KeyValueStore } from './unsent-queue';

function memoryStore(): KeyValueStore {
  const m = new Map<string, string>();
  return { getItem: (k) => m.get(k) ?? null, setItem: (k, v) => void m.set(k, v) };
}

const entry = (key: string, jobId = 'j1') => ({ key, jobId, body: { value: key }, createdAt: '2026-01-01T00:00:00Z' });

describe('unsent readings queue', () => {
  it('keeps entries across loads and replaces an entry with the same key', () => {
    const s = memoryStore();
    enqueueUnsent(s, entry('a'));
    enqueueUnsent(s, entry('b'));
    enqueueUnsent(s, { ...entry('a'), body: { value: 'a2' } });
    expect(loadUnsent(s).map((e) => e.key)).toEqual(['b', 'a']);
  });

  it('stops at the first network failure, keeps it and later ones, and counts the attempt', async () => {
    const s = memoryStore();
    ['a', 'b', 'c'].forEach((k) => enqueueUnsent(s, entry(k)));
    const seen: string[] = [];
    const r = await flushUnsent(s, 'j1', async (e) => {
      seen.push(e.key);
      return e.key === 'b' ? 'retry' : 'sent';
    });
    expect(seen).toEqual(['a', 'b']);
    expect(r).toMatchObject({ sent: ['a'], remaining: 2 });
    expect(loadUnsent(s).map((e) => [e.key, e.attempts])).toEqual([
      ['b', 1],
      ['c', 0],
    ]);
  });

  it('re-sends with the same idempotency key after a failure', async () => {
    const s = memoryStore();
    enqueueUnsent(s, entry('k-1'));
    const keys: string[] = [];
    await flushUnsent(s, 'j1', async (e) => (keys.push(e.key), 'retry'));
    await flushUnsent(s, 'j1', async (e) => (keys.push(e.key), 'sent'));
    expect(keys).toEqual(['k-1', 'k-1']);
    expect(loadUnsent(s)).toEqual([]);
  });

  it('drops and reports a reading the server refuses, and leaves other jobs alone', async () => {
    const s = memoryStore();
    enqueueUnsent(s, entry('x'));
    enqueueUnsent(s, entry('other', 'j2'));
    const r = await flushUnsent(s, 'j1', async () => ({ outcome: 'rejected' as const, message: 'job is closed' }));
    expect(r.rejected.map((x) => [x.entry.key, x.message])).toEqual([['x', 'job is closed']]);
    expect(loadUnsent(s).map((e) => e.key)).toEqual(['other']);
  });

  it('survives corrupt storage', () => {
    const s = memoryStore();
    s.setItem('splitscope.unsent-readings.v1', '{not json');
    expect(loadUnsent(s)).toEqual([]);
  });
});
