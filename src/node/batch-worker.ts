/**
 * The worker-thread script of {@link solveBatch} (a built entry of its own: dist/batch-worker.js
 * and .cjs). It receives one variant at a time ({@link BatchJob}), solves it with
 * {@link solveVariant} and its own symbolic cache, and posts back plain JSON.
 */
import { parentPort, workerData } from 'node:worker_threads';
import type { BatchJob, BatchWorkerData, BatchWorkerMessage } from './batch';
import { solveVariant, SymbolicCache } from './variant';

const port = parentPort;
if (port) {
  const data = workerData as BatchWorkerData;
  const cache = new SymbolicCache(data.cacheSize);
  port.on('message', (job: BatchJob) => {
    const progress = data.forwardProgress
      ? (phase: string, fraction: number) => port.postMessage({ type: 'progress', index: job.index, phase, fraction } satisfies BatchWorkerMessage)
      : undefined;
    const outcome = solveVariant(job.model, data.options, cache, progress);
    port.postMessage({ type: 'result', index: job.index, ...outcome } satisfies BatchWorkerMessage);
  });
  port.postMessage({ type: 'ready' } satisfies BatchWorkerMessage);
}
