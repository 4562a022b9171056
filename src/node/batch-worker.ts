/**
 * The worker-thread script of {@link solveBatch} (a built entry of its own: dist/batch-worker.js
 * and .cjs). It holds the study's base model from its `workerData` (sent once per worker),
 * receives chunks of variants ({@link BatchJob}), builds each one's model (the whole model, or
 * the base with the variant's JSON Merge Patch applied), solves it with
 * {@link solveVariantPacked} and its own symbolic cache, and posts each result as it finishes,
 * with the packed mode shapes transferred rather than copied.
 */
import { parentPort, workerData } from 'node:worker_threads';
import type { BatchJob, BatchWorkerData, BatchWorkerMessage } from './batch';
import { applyMergePatch, solveVariantPacked, SymbolicCache } from './variant';

const port = parentPort;
if (port) {
  const data = workerData as BatchWorkerData;
  const cache = new SymbolicCache(data.cacheSize);
  port.on('message', (job: BatchJob) => {
    for (const item of job.items) {
      const index = item.index;
      const progress = data.forwardProgress
        ? (phase: string, fraction: number) => port.postMessage({ type: 'progress', index, phase, fraction } satisfies BatchWorkerMessage)
        : undefined;
      // The patched model shares its unchanged members with the base; validation does not modify it.
      const model = 'patch' in item ? applyMergePatch(data.base, item.patch) : item.model;
      const { outcome, shapes } = solveVariantPacked(model, data.options, cache, progress);
      if (shapes && outcome.ok) {
        port.postMessage({ type: 'result', index, ...outcome, shapes } satisfies BatchWorkerMessage, [shapes.buffer as ArrayBuffer]);
      } else {
        port.postMessage({ type: 'result', index, ...outcome } satisfies BatchWorkerMessage);
      }
    }
  });
  port.postMessage({ type: 'ready' } satisfies BatchWorkerMessage);
}
