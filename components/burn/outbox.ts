import { useSyncExternalStore } from 'react';
import type { MeasurementInput, Pair, PostMarksInput } from '../../shared/schemas/burn';
import { ApiError, apiRequest } from '../api/client';
import { newClientId } from '../client-id';
import { readLocal, writeLocal } from '../local-store';

// Field work first lands here, on the device, then goes to the server. Every write is
// idempotent (marks carry their own ids; a measurement is a PUT), so sending again after a
// lost answer stores nothing twice.

export type OutboxMark = PostMarksInput['marks'][number];
type MarksOp = { id: string; type: 'marks'; labId: string; pairId: string; marks: OutboxMark[] };
type MeasurementOp = {
  id: string;
  type: 'measurement';
  labId: string;
  pairId: string;
  specimenId: string;
  values: MeasurementInput;
};
type Op = MarksOp | MeasurementOp;
type State = { ops: Op[]; failures: { at: string; message: string }[]; syncing: boolean };

const KEY = 'quenchbook.outbox.v1';
let state: State = { ops: readLocal<Op[]>(KEY) ?? [], failures: [], syncing: false };
const listeners = new Set<() => void>();
const syncedListeners = new Set<(pair: Pair) => void>();

function publish(next: Partial<State>): void {
  state = { ...state, ...next };
  writeLocal(KEY, state.ops);
  listeners.forEach((l) => l());
}

export function onSynced(listener: (pair: Pair) => void): () => void {
  syncedListeners.add(listener);
  return () => syncedListeners.delete(listener);
}

export function queueMarks(labId: string, pairId: string, marks: OutboxMark[]): void {
  publish({ ops: [...state.ops, { id: newClientId(), type: 'marks', labId, pairId, marks }] });
  void flush();
}

export function queueMeasurement(
  labId: string,
  pairId: string,
  specimenId: string,
  values: MeasurementInput,
): void {
  // A newer value for the same specimen replaces the one still waiting.
  const others = state.ops.filter(
    (o) => !(o.type === 'measurement' && o.pairId === pairId && o.specimenId === specimenId),
  );
  publish({
    ops: [...others, { id: newClientId(), type: 'measurement', labId, pairId, specimenId, values }],
  });
  void flush();
}

function send(op: Op): Promise<Pair> {
  return op.type === 'marks'
    ? apiRequest(`/api/labs/${op.labId}/pairs/${op.pairId}/marks`, (k) => k.pairSchema, {
        method: 'POST',
        body: { marks: op.marks },
      })
    : apiRequest(
        `/api/labs/${op.labId}/pairs/${op.pairId}/measurements/${op.specimenId}`,
        (k) => k.pairSchema,
        {
          method: 'PUT',
          body: op.values,
        },
      );
}

/** Sends what waits, oldest first; stops at the first network failure and tries again later. */
export async function flush(): Promise<void> {
  if (state.syncing || !state.ops.length) return;
  publish({ syncing: true });
  try {
    for (const op of [...state.ops]) {
      try {
        const pair = await send(op);
        publish({ ops: state.ops.filter((o) => o.id !== op.id) });
        syncedListeners.forEach((l) => l(pair));
      } catch (err) {
        const retryable =
          !(err instanceof ApiError) || err.status === 0 || err.status >= 500 || err.status === 401;
        if (retryable) break;
        // The server refused it for good (e.g. the test was signed off meanwhile): say so.
        publish({
          ops: state.ops.filter((o) => o.id !== op.id),
          failures: [...state.failures, { at: new Date().toISOString(), message: err.message }],
        });
      }
    }
  } finally {
    publish({ syncing: false });
  }
}

export function pendingMarks(pairId: string): OutboxMark[] {
  return state.ops.flatMap((o) => (o.type === 'marks' && o.pairId === pairId ? o.marks : []));
}

export function pendingMeasurement(
  pairId: string,
  specimenId: string,
): MeasurementInput | undefined {
  const op = state.ops.find(
    (o) => o.type === 'measurement' && o.pairId === pairId && o.specimenId === specimenId,
  );
  return op?.type === 'measurement' ? op.values : undefined;
}

export function useOutbox(): State {
  return useSyncExternalStore(
    (l) => {
      listeners.add(l);
      return () => listeners.delete(l);
    },
    () => state,
    () => state,
  );
}

// Try again when the connection returns, and every few seconds while anything waits.
if (typeof window !== 'undefined' && typeof window.addEventListener === 'function') {
  window.addEventListener('online', () => void flush());
  setInterval(() => void flush(), 4000);
}

/** The last copy of a test seen from the server, for opening it again without a connection. */
export function cachePair(pair: Pair): void {
  writeLocal(`quenchbook.pair.${pair.id}`, pair);
}
export function cachedPair(pairId: string): Pair | undefined {
  return readLocal<Pair>(`quenchbook.pair.${pairId}`);
}
