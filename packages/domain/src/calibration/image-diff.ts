import { DomainError } from '../errors';
import type { MemoryImage } from './memory-image';

/** A stretch of changed bytes; `end` is EXCLUSIVE. It may include unchanged bytes up to the merge gap. */
export interface DiffRange {
  start: number;
  end: number;
  changedBytes: number;
}

export interface ImageDiff {
  changedBytes: number;
  /** Addresses present in either image. */
  comparedBytes: number;
  /** changedBytes / comparedBytes, 0 when both images are empty. */
  changedShare: number;
  ranges: DiffRange[];
}

export interface DiffOptions {
  /** Changed bytes separated by at most this many unchanged (or absent) addresses share one range. Default 16. */
  mergeGap?: number;
}

/** Accumulates changed addresses into ranges, closing a range only when the next change is too far away. */
class RangeCollector {
  readonly ranges: DiffRange[] = [];
  changedBytes = 0;
  private start = -1;
  private end = -1;
  private changed = 0;

  constructor(private readonly mergeGap: number) {}

  /** Marks [from, to) as changed; calls must come in ascending address order. */
  mark(from: number, to: number): void {
    if (this.start >= 0 && from - this.end <= this.mergeGap) {
      this.end = to;
    } else {
      this.flush();
      this.start = from;
      this.end = to;
    }
    this.changed += to - from;
    this.changedBytes += to - from;
  }

  flush(): void {
    if (this.start >= 0) this.ranges.push({ start: this.start, end: this.end, changedBytes: this.changed });
    this.start = -1;
    this.changed = 0;
  }
}

/** Compares the overlap of two byte runs in a tight typed-array loop, marking each changed byte. */
function compareBytes(collector: RangeCollector, address: number, x: Uint8Array, xFrom: number, y: Uint8Array, yFrom: number, length: number): void {
  for (let i = 0; i < length; i += 1) {
    if (x[xFrom + i] !== y[yFrom + i]) collector.mark(address + i, address + i + 1);
  }
}

/**
 * Compares two images address by address. A byte present in one image only counts as changed.
 * Work is one pass over both segment lists; only ranges are allocated, never per-byte objects.
 */
export function diffImages(a: MemoryImage, b: MemoryImage, { mergeGap = 16 }: DiffOptions = {}): ImageDiff {
  if (!Number.isInteger(mergeGap) || mergeGap < 0) throw new DomainError('validation', `mergeGap must be a whole number ≥ 0; got ${mergeGap}.`);
  const collector = new RangeCollector(mergeGap);
  const left = a.segments;
  const right = b.segments;
  let comparedBytes = 0;
  let i = 0;
  let j = 0;
  // Position within the current segment of each side, so partly consumed segments resume correctly.
  let leftAt = left[0]?.start ?? Infinity;
  let rightAt = right[0]?.start ?? Infinity;
  while (i < left.length || j < right.length) {
    const l = left[i];
    const r = right[j];
    const leftEnd = l === undefined ? Infinity : l.start + l.data.length;
    const rightEnd = r === undefined ? Infinity : r.start + r.data.length;
    let upTo: number;
    if (leftAt < rightAt) {
      upTo = Math.min(leftEnd, rightAt);
      collector.mark(leftAt, upTo);
    } else if (rightAt < leftAt) {
      upTo = Math.min(rightEnd, leftAt);
      collector.mark(rightAt, upTo);
    } else {
      upTo = Math.min(leftEnd, rightEnd);
      compareBytes(collector, leftAt, l!.data, leftAt - l!.start, r!.data, rightAt - r!.start, upTo - leftAt);
    }
    comparedBytes += upTo - Math.min(leftAt, rightAt);
    if (leftAt < upTo) leftAt = upTo;
    if (rightAt < upTo) rightAt = upTo;
    if (leftAt >= leftEnd) {
      i += 1;
      leftAt = left[i]?.start ?? Infinity;
    }
    if (rightAt >= rightEnd) {
      j += 1;
      rightAt = right[j]?.start ?? Infinity;
    }
  }
  collector.flush();
  const changedBytes = collector.changedBytes;
  return { changedBytes, comparedBytes, changedShare: comparedBytes === 0 ? 0 : changedBytes / comparedBytes, ranges: collector.ranges };
}

export interface DiffPage {
  ranges: DiffRange[];
  /** 1-based page number, as asked. */
  page: number;
  pageSize: number;
  totalRanges: number;
  pageCount: number;
}

/** One page (1-based) of a long list of diff ranges; a page past the end is empty. */
export function pageDiffRanges(ranges: readonly DiffRange[], page: number, pageSize: number): DiffPage {
  if (!Number.isInteger(page) || page < 1) throw new DomainError('validation', `Page must be a whole number from 1; got ${page}.`);
  if (!Number.isInteger(pageSize) || pageSize < 1) throw new DomainError('validation', `Page size must be a whole number from 1; got ${pageSize}.`);
  const from = (page - 1) * pageSize;
  return {
    ranges: ranges.slice(from, from + pageSize),
    page,
    pageSize,
    totalRanges: ranges.length,
    pageCount: Math.ceil(ranges.length / pageSize),
  };
}
