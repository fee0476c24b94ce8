// The tablet's durable queue of readings not yet acknowledged by the server (IndexedDB). Each reading
// keeps the idempotency key it was given when typed, so sending it again can never store it twice.
// Readings are sent one at a time, oldest first; a connection problem stops the round (order kept), a
// refusal by the server moves the reading to "needs attention" and the round goes on.
import { createStore, get, update } from 'idb-keyval';
import type { CreateReadingInput } from '#shared/api/readings';
import { ApiFailure } from '../../lib/api';
import { postPhoto, postReading } from './api';

export interface OutboxEntry {
  key: string;
  input: CreateReadingInput;
  mark: string;
  /** A photo taken with the reading, sent once the reading is stored. */
  photo?: Blob;
  /** Set once the server stored the reading while its photo still waits. */
  readingId?: string;
  status: 'waiting' | 'failed';
  error?: string;
  createdAt: string;
}

export interface OutboxState {
  entries: OutboxEntry[];
  sending: boolean;
  /** The server said the sign-in is no longer valid: the queue waits for a new sign-in. */
  signInNeeded: boolean;
  lastError: string | null;
}

const store = createStore('crownwatch', 'outbox');
const KEY = 'entries';
let state: OutboxState = { entries: [], sending: false, signInNeeded: false, lastError: null };
const listeners = new Set<() => void>();
const sentListeners = new Set<(pieceId: string) => void>();

/** Called after each reading the server acknowledged (to refresh what shows that piece). */
export const onSent = (l: (pieceId: string) => void): (() => void) => {
  sentListeners.add(l);
  return () => sentListeners.delete(l);
};

const emit = (patch: Partial<OutboxState>): void => {
  state = { ...state, ...patch };
  for (const l of listeners) l();
};

export const subscribe = (l: () => void): (() => void) => {
  listeners.add(l);
  return () => listeners.delete(l);
};
export const snapshot = (): OutboxState => state;

async function load(): Promise<OutboxEntry[]> {
  return ((await get(KEY, store)) as OutboxEntry[] | undefined) ?? [];
}

async function change(fn: (list: OutboxEntry[]) => OutboxEntry[]): Promise<void> {
  let next: OutboxEntry[] = [];
  await update(KEY, (old: OutboxEntry[] | undefined) => (next = fn(old ?? [])), store);
  emit({ entries: next });
}

export async function refresh(): Promise<void> {
  emit({ entries: await load() });
}

/** Keeps the reading on the device first, then tries to send it. */
export async function enqueue(input: CreateReadingInput, key: string, mark: string, photo?: Blob): Promise<void> {
  await change((l) => (l.some((e) => e.key === key) ? l : [...l, { key, input, mark, photo, status: 'waiting', createdAt: new Date().toISOString() }]));
  void flush();
}

export async function discard(key: string): Promise<void> {
  await change((l) => l.filter((e) => e.key !== key));
}

/** Puts a reading that needed attention back in line (after the cause was fixed, e.g. signed in again). */
export async function retry(key: string): Promise<void> {
  await change((l) => l.map((e) => (e.key === key ? { ...e, status: 'waiting', error: undefined } : e)));
  void flush();
}

const transient = (e: ApiFailure): boolean => e.status === 0 || e.status === 408 || e.status === 429 || e.status >= 500;

let running: Promise<void> | null = null;
let again = false;

/**
 * Sends what waits, oldest first. Safe to call any time; one round runs at a time. A call during a round
 * (the inspector taps "Send now" while an answer is still on its way) gets one more round after it, so a
 * round that ends on a lost answer is not the last word.
 */
export function flush(): Promise<void> {
  if (running) {
    again = true;
    return running;
  }
  running = (async () => {
    emit({ sending: true });
    try {
      for (;;) {
        const next = (await load()).find((e) => e.status === 'waiting');
        if (!next) break;
        try {
          const readingId = next.readingId ?? (await postReading(next.input, next.key)).id;
          if (next.photo) {
            // Remember the stored reading first: if the photo fails, only the photo is sent again.
            await change((l) => l.map((x) => (x.key === next.key ? { ...x, readingId } : x)));
            await postPhoto(readingId, next.photo);
          }
          await change((l) => l.filter((e) => e.key !== next.key));
          emit({ lastError: null, signInNeeded: false });
          for (const l of sentListeners) l(next.input.pieceId);
        } catch (e) {
          if (!(e instanceof ApiFailure) || transient(e)) {
            emit({ lastError: e instanceof Error ? e.message : 'not sent' });
            break;
          }
          if (e.status === 401 || e.body.code === 'csrf_failed') {
            emit({ signInNeeded: true });
            break;
          }
          const detail = Object.entries(e.fieldErrors).map(([f, m]) => `${f}: ${m.join(', ')}`).join('; ');
          await change((l) => l.map((x) => (x.key === next.key ? { ...x, status: 'failed', error: detail ? `${e.message} (${detail})` : e.message } : x)));
        }
      }
    } finally {
      emit({ sending: false });
      running = null;
      if (again) {
        again = false;
        void flush();
      }
    }
  })();
  return running;
}

/** Starts the background sending: at start, when the connection returns, and every 20 s while readings wait. */
export function startOutbox(): void {
  void refresh().then(flush);
  window.addEventListener('online', () => void flush());
  setInterval(() => {
    if (state.entries.some((e) => e.status === 'waiting') && !state.signInNeeded) void flush();
  }, 20_000);
}

