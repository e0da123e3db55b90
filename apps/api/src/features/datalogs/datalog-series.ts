import { Worker } from 'node:worker_threads';
import { createLTTB } from 'downsample';
import { DomainError, type DomainErrorCode } from '@revloop/domain';
import type { CanonicalChannel, ReadDatalogOptions } from '@revloop/domain/datalog';

export interface SeriesJob {
  filePath: string;
  options: Omit<ReadDatalogOptions, 'onProgress'>;
}

export type SeriesColumns = { time: Float64Array } & Partial<Record<Exclude<CanonicalChannel, 'time'>, Float32Array>>;

export type SeriesMessage =
  | { type: 'done'; rows: number; columns: SeriesColumns }
  | { type: 'error'; code: DomainErrorCode | null; message: string };

const WORKER_ENTRY = new URL('./datalog-series.worker.mjs', import.meta.url);

/** Reads a log into canonical columns on a worker thread; the arrays come back transferred. */
function readColumnsInWorker(job: SeriesJob): Promise<SeriesColumns> {
  return new Promise((resolve, reject) => {
    const worker = new Worker(WORKER_ENTRY, { workerData: job });
    let settled = false;
    const settle = (fn: () => void) => {
      if (!settled) {
        settled = true;
        fn();
      }
    };
    worker.on('message', (message: SeriesMessage) => {
      if (message.type === 'done') settle(() => resolve(message.columns));
      else settle(() => reject(message.code === null ? new Error(message.message) : new DomainError(message.code, message.message)));
    });
    worker.on('error', (error) => settle(() => reject(error)));
    worker.on('exit', (code) => settle(() => reject(new Error(`The series worker stopped (exit code ${code}).`))));
  });
}

/**
 * Parsed logs kept in memory for chart requests, newest used last. Zooming asks for the same log many times;
 * parsing it again each time would cost a second per request on a large log. Bounded by total bytes.
 */
export class SeriesCache {
  private readonly entries = new Map<string, Promise<SeriesColumns>>();
  private readonly sizes = new Map<string, number>();

  constructor(private readonly maxBytes = 256 * 1024 * 1024) {}

  get(key: string, job: SeriesJob): Promise<SeriesColumns> {
    const hit = this.entries.get(key);
    if (hit) {
      this.entries.delete(key);
      this.entries.set(key, hit);
      return hit;
    }
    const loading = readColumnsInWorker(job);
    this.entries.set(key, loading);
    loading.then(
      (columns) => {
        this.sizes.set(key, Object.values(columns).reduce((sum, c) => sum + c.byteLength, 0));
        this.evict();
      },
      () => this.entries.delete(key),
    );
    return loading;
  }

  private evict(): void {
    let total = [...this.sizes.values()].reduce((a, b) => a + b, 0);
    for (const key of this.entries.keys()) {
      if (total <= this.maxBytes || this.entries.size <= 1) break;
      total -= this.sizes.get(key) ?? 0;
      this.entries.delete(key);
      this.sizes.delete(key);
    }
  }
}

/** First index with time ≥ t (time is ascending). */
function lowerBound(time: Float64Array, t: number): number {
  let lo = 0;
  let hi = time.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if ((time[mid] as number) < t) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/**
 * One channel between `from` and `to` seconds, downsampled with Largest-Triangle-Three-Buckets (Steinarsson 2013,
 * via the `downsample` package) to at most `points`. Blank samples are left out first: LTTB needs numbers.
 */
export function downsampleChannel(
  time: Float64Array,
  values: Float32Array,
  from: number,
  to: number,
  points: number,
): { t: number[]; v: number[] } {
  const start = lowerBound(time, from);
  const end = lowerBound(time, to + 1e-9);
  const kept: number[] = [];
  for (let i = start; i < end; i++) if (Number.isFinite(values[i] as number)) kept.push(i);
  const lttb = createLTTB<number>({ x: (i: number) => time[i] as number, y: (i: number) => values[i] as number });
  const picked = Array.from(lttb(kept, points));
  return {
    t: picked.map((i) => Math.round((time[i] as number) * 1000) / 1000),
    v: picked.map((i) => Math.round((values[i] as number) * 1000) / 1000),
  };
}
