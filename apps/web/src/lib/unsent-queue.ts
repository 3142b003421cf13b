/**
 * Readings typed at the bench are kept here until the server has them. Each entry carries the idempotency key it
 * was first sent with, so a re-send after a dropped connection can never record the same reading twice.
 * Storage is injected (localStorage in the browser, a Map in tests).
 */

export interface KeyValueStore {
  getItem(key: string): string | null;
  setItem(key: string, value: string): void;
}

export interface UnsentEntry<B> {
  /** Idempotency key: the same for every attempt of this reading. */
  key: string;
  jobId: string;
  body: B;
  createdAt: string;
  attempts: number;
  lastError?: string;
}

const STORE_KEY = 'splitscope.unsent-readings.v1';

export function loadUnsent<B>(store: KeyValueStore): UnsentEntry<B>[] {
  try {
    const raw = store.getItem(STORE_KEY);
    const parsed: unknown = raw ? JSON.parse(raw) : [];
    return Array.isArray(parsed) ? (parsed as UnsentEntry<B>[]) : [];
  } catch {
    return [];
  }
}

function save<B>(store: KeyValueStore, entries: UnsentEntry<B>[]) {
  store.setItem(STORE_KEY, JSON.stringify(entries));
}

export function enqueueUnsent<B>(store: KeyValueStore, entry: Omit<UnsentEntry<B>, 'attempts'>): UnsentEntry<B> {
  const all = loadUnsent<B>(store);
  const full = { ...entry, attempts: 0 };
  save(store, [...all.filter((e) => e.key !== entry.key), full]);
  return full;
}

export function removeUnsent(store: KeyValueStore, key: string) {
  save(
    store,
    loadUnsent(store).filter((e) => e.key !== key),
  );
}

export function markAttempt(store: KeyValueStore, key: string, error: string) {
  save(
    store,
    loadUnsent(store).map((e) => (e.key === key ? { ...e, attempts: e.attempts + 1, lastError: error } : e)),
  );
}

export type SendOutcome = 'sent' | 'retry' | 'rejected';

/**
 * Send every unsent entry of a job in the order typed. A network failure stops the run (later entries would fail
 * too) and keeps the entry; a refusal by the server (4xx) drops it and reports it, since re-sending cannot help.
 */
export async function flushUnsent<B>(
  store: KeyValueStore,
  jobId: string,
  send: (entry: UnsentEntry<B>) => Promise<SendOutcome | { outcome: 'rejected'; message: string }>,
): Promise<{ sent: string[]; rejected: { entry: UnsentEntry<B>; message: string }[]; remaining: number }> {
  const sent: string[] = [];
  const rejected: { entry: UnsentEntry<B>; message: string }[] = [];
  for (const entry of loadUnsent<B>(store).filter((e) => e.jobId === jobId)) {
    const r = await send(entry);
    if (r === 'sent') {
      removeUnsent(store, entry.key);
      sent.push(entry.key);
    } else if (r === 'retry') {
      markAttempt(store, entry.key, 'not sent yet: the server cannot be reached');
      break;
    } else {
      removeUnsent(store, entry.key);
      rejected.push({ entry, message: typeof r === 'object' ? r.message : 'refused by the server' });
    }
  }
  return { sent, rejected, remaining: loadUnsent(store).filter((e) => e.jobId === jobId).length };
}
