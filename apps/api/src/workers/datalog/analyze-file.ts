import os from 'node:os';
import { Worker } from 'node:worker_threads';
import { DomainError, type DomainErrorCode } from '@revloop/domain';
import type { AnalyzeOptions, DatalogReport } from '@revloop/domain/datalog';

/** What crosses the thread boundary: everything but the progress callback (functions cannot be cloned). */
export type WorkerAnalyzeOptions = Omit<AnalyzeOptions, 'onProgress'>;

export interface AnalyzeJob {
  filePath: string;
  options: WorkerAnalyzeOptions;
}

export type AnalyzeMessage =
  | { type: 'progress'; fraction: number }
  | { type: 'done'; report: DatalogReport }
  | { type: 'error'; code: DomainErrorCode | null; message: string };

// A plain .mjs entry: worker threads do not get the TypeScript loader of vitest, so it loads tsx itself.
const WORKER_ENTRY = new URL('./analyze-file.worker.mjs', import.meta.url);

/**
 * At most this many analyses run at once (one per core); the rest wait their turn, so a burst of uploads cannot
 * start dozens of threads that each hold a large log in memory.
 */
const MAX_RUNNING = Math.max(1, os.availableParallelism());
let running = 0;
const waiting: Array<() => void> = [];

async function withSlot<T>(work: () => Promise<T>): Promise<T> {
  // A finishing analysis hands its slot straight to the next in line, so the count never overshoots.
  if (running >= MAX_RUNNING) await new Promise<void>((resolve) => waiting.push(resolve));
  else running += 1;
  try {
    return await work();
  } finally {
    const next = waiting.shift();
    if (next) next();
    else running -= 1;
  }
}

/** Reads and analyses a datalog file on a worker thread so a 90 MB log never blocks the request thread. */
export function analyzeFileInWorker(
  filePath: string,
  options: WorkerAnalyzeOptions = {},
  onProgress?: (fraction: number) => void,
): Promise<DatalogReport> {
  return withSlot(() => runWorker(filePath, options, onProgress));
}

function runWorker(filePath: string, options: WorkerAnalyzeOptions, onProgress?: (fraction: number) => void): Promise<DatalogReport> {
  return new Promise((resolve, reject) => {
    const job: AnalyzeJob = { filePath, options };
    const worker = new Worker(WORKER_ENTRY, { workerData: job });
    let settled = false;
    const settle = (fn: () => void) => {
      if (settled) return;
      settled = true;
      fn();
    };
    worker.on('message', (message: AnalyzeMessage) => {
      if (message.type === 'progress') onProgress?.(message.fraction);
      else if (message.type === 'done') settle(() => resolve(message.report));
      else
        settle(() =>
          reject(
            message.code === null
              ? new Error(message.message)
              : new DomainError(message.code, message.message),
          ),
        );
    });
    worker.on('error', (error) => settle(() => reject(error)));
    worker.on('exit', (code) =>
      settle(() =>
        reject(new Error(`The datalog worker stopped (exit code ${code}) before it finished.`)),
      ),
    );
  });
}
