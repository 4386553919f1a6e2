/** The window's side of the analysis worker: typed, promise-based requests with progress reports. */
import { deserializeError } from '../../../shared/errors';
import type { PackedEvaluateReply, WorkerEnvelope, WorkerMessage, WorkerReplies, WorkerRequest } from './protocol';
import { unpackEvaluation } from './packEvaluation';

function isPacked(value: unknown): value is PackedEvaluateReply {
  return typeof value === 'object' && value !== null && 'packed' in value;
}

/** Progress of a long request (preparing trials). */
export type ProgressListener = (done: number, total: number, label: string) => void;

/** A running analysis worker. */
export interface AnalysisClient {
  call<T extends WorkerRequest['type']>(request: Extract<WorkerRequest, { type: T }>, onProgress?: ProgressListener, transfer?: Transferable[]): Promise<WorkerReplies[T]>;
  terminate(): void;
}

/** Starts the worker. */
export function createAnalysisClient(): AnalysisClient {
  const worker = new Worker(new URL('./analysisWorker.ts', import.meta.url), { type: 'module', name: 'forecatch-analysis' });
  let nextId = 1;
  const pending = new Map<number, { resolve: (v: unknown) => void; reject: (e: unknown) => void; onProgress?: ProgressListener }>();
  worker.onmessage = (event: MessageEvent<WorkerMessage>) => {
    const msg = event.data;
    const p = pending.get(msg.id);
    if (!p) return;
    if (msg.kind === 'progress') p.onProgress?.(msg.done, msg.total, msg.label);
    else {
      pending.delete(msg.id);
      if (msg.kind === 'result') p.resolve(isPacked(msg.value) ? { evaluation: unpackEvaluation(msg.value.packed), ms: msg.value.ms, quick: msg.value.quick } : msg.value);
      else p.reject(deserializeError(msg.error));
    }
  };
  worker.onerror = (event) => {
    for (const p of pending.values()) p.reject(new Error(`analysis worker failed: ${event.message}`));
    pending.clear();
  };
  return {
    call(request, onProgress, transfer = []) {
      const id = nextId++;
      return new Promise((resolve, reject) => {
        pending.set(id, { resolve: resolve as (v: unknown) => void, reject, onProgress });
        worker.postMessage({ id, request } satisfies WorkerEnvelope, transfer);
      });
    },
    terminate: () => worker.terminate(),
  };
}
