import { statSync } from 'node:fs';
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

// A plain .mjs entry: it runs the job compiled to JavaScript (apps/api/scripts/build-node.mjs), under tsx, vitest or node.
const WORKER_ENTRY = new URL('./analyze-file.worker.mjs', import.meta.url);

/**
 * A thread started ahead of time with the analysis code loaded: a log then waits for no thread start-up (tens of
 * milliseconds, the largest part of a small log's wait). It does not keep the process alive.
 */
let spare: { worker: Worker; drop: () => void } | undefined;

/** Makes `worker` the spare: it waits unreferenced, so it never keeps the process alive. */
function keepAsSpare(worker: Worker): void {
  worker.unref();
  const drop = () => {
    if (spare?.worker === worker) spare = undefined;
  };
  worker.on('error', drop);
  worker.on('exit', drop);
  spare = { worker, drop };
}

/** Starts the spare thread unless one is waiting; the server calls it at start, each analysis after it ends. */
export function warmAnalysisWorker(): void {
  if (!spare) keepAsSpare(new Worker(WORKER_ENTRY));
}

/**
 * Logs below this size leave their thread as the spare, its compiled code still hot, so the next log of a busy shop
 * skips the cold start; after a larger log the thread ends and its memory goes with it.
 */
const REUSE_BELOW_BYTES = 16 * 1024 * 1024;

function release(worker: Worker, fileBytes: number): void {
  worker.removeAllListeners('message');
  worker.removeAllListeners('error');
  worker.removeAllListeners('exit');
  if (spare || fileBytes >= REUSE_BELOW_BYTES) void worker.terminate();
  else keepAsSpare(worker);
}

function takeWorker(): Worker {
  const taken = spare;
  spare = undefined;
  if (taken === undefined) return new Worker(WORKER_ENTRY);
  taken.worker.off('error', taken.drop);
  taken.worker.off('exit', taken.drop);
  taken.worker.ref();
  return taken.worker;
}

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
  const fileBytes = statSync(filePath, { throwIfNoEntry: false })?.size ?? Infinity;
  return withSlot(() => runWorker(filePath, fileBytes, options, onProgress)).finally(warmAnalysisWorker);
}

function runWorker(
  filePath: string,
  fileBytes: number,
  options: WorkerAnalyzeOptions,
  onProgress?: (fraction: number) => void,
): Promise<DatalogReport> {
  return new Promise((resolve, reject) => {
    const job: AnalyzeJob = { filePath, options };
    const worker = takeWorker();
    worker.postMessage(job);
    let settled = false;
    const settle = (fn: () => void) => {
      if (settled) return;
      settled = true;
      fn();
    };
    // The thread answered (a report or a refusal of the file): it is healthy and may serve the next log.
    const answered = (fn: () => void) => {
      if (!settled) release(worker, fileBytes);
      settle(fn);
    };
    worker.on('message', (message: AnalyzeMessage) => {
      if (message.type === 'progress') onProgress?.(message.fraction);
      else if (message.type === 'done') answered(() => resolve(message.report));
      else
        answered(() =>
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
