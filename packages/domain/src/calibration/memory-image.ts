import { DomainError } from '../errors';

/** A run of bytes at consecutive addresses starting at `start`. */
export interface ImageSegment {
  readonly start: number;
  readonly data: Uint8Array;
}

/**
 * The bytes of a calibration by address. Invariant (kept by `createMemoryImage` and the parsers):
 * segments are sorted by start, never overlap, and adjacent segments are merged, so two images
 * holding the same bytes at the same addresses have the same segments.
 */
export interface MemoryImage {
  readonly segments: readonly ImageSegment[];
}

/** An address range; `end` is EXCLUSIVE (the first address after the range). */
export interface AddressRange {
  start: number;
  end: number;
}

/** The highest address a 32-bit format can hold, plus one. */
export const ADDRESS_LIMIT = 0x1_0000_0000;

interface Run {
  start: number;
  end: number;
  buffer: Uint8Array;
  /** Record starts and their source lines, kept only to name the exact line of an overlap. */
  recordStarts: number[];
  recordLines: number[];
}

const INITIAL_RUN_CAPACITY = 4096;

export const hexAddress = (address: number): string => `0x${address.toString(16).toUpperCase().padStart(4, '0')}`;

/**
 * Collects data records in file order into contiguous runs without a per-record allocation; `build`
 * sorts the runs, refuses overlaps (naming the later record's line) and merges adjacent runs.
 */
export class ImageBuilder {
  private readonly runs: Run[] = [];
  private current: Run | undefined;

  constructor(private readonly errorCode: 'invalid_file' | 'validation' = 'invalid_file') {}

  add(start: number, data: Uint8Array, line = 0): void {
    if (data.length === 0) return;
    if (start < 0 || start + data.length > ADDRESS_LIMIT || !Number.isInteger(start)) {
      throw new DomainError(this.errorCode, `${this.at(line)}Data at ${hexAddress(start)} lies outside the 32-bit address space.`, this.details(line));
    }
    let run = this.current;
    if (run === undefined || run.end !== start) {
      run = { start, end: start, buffer: new Uint8Array(Math.max(INITIAL_RUN_CAPACITY, data.length)), recordStarts: [], recordLines: [] };
      this.runs.push(run);
      this.current = run;
    }
    const used = run.end - run.start;
    if (used + data.length > run.buffer.length) {
      const grown = new Uint8Array(Math.max(run.buffer.length * 2, used + data.length));
      grown.set(run.buffer.subarray(0, used));
      run.buffer = grown;
    }
    run.buffer.set(data, used);
    run.recordStarts.push(start);
    run.recordLines.push(line);
    run.end += data.length;
  }

  build(): MemoryImage {
    const runs = [...this.runs].sort((x, y) => x.start - y.start);
    this.refuseOverlaps(runs);
    const segments: ImageSegment[] = [];
    let first = 0;
    while (first < runs.length) {
      let last = first;
      while (last + 1 < runs.length && runs[last + 1]!.start === runs[last]!.end) last += 1;
      segments.push(joinRuns(runs.slice(first, last + 1)));
      first = last + 1;
    }
    return { segments };
  }

  private refuseOverlaps(sorted: readonly Run[]): void {
    let reach: Run | undefined;
    let worst: { line: number; message: string } | undefined;
    for (const run of sorted) {
      if (reach !== undefined && run.start < reach.end) {
        const clash = describeOverlap(reach, run);
        if (worst === undefined || clash.line < worst.line) worst = clash;
      }
      if (reach === undefined || run.end > reach.end) reach = run;
    }
    if (worst !== undefined) {
      throw new DomainError(this.errorCode, `${this.at(worst.line)}${worst.message}`, this.details(worst.line));
    }
  }

  private at(line: number): string {
    return line > 0 ? `Line ${line}: ` : '';
  }

  private details(line: number): { line: number } | undefined {
    return line > 0 ? { line } : undefined;
  }
}

/** Runs are file-contiguous, so the later one either starts inside the earlier or grew into it. */
function describeOverlap(lower: Run, upper: Run): { line: number; message: string } {
  const upperIsLater = (upper.recordLines[0] ?? 0) >= (lower.recordLines.at(-1) ?? 0);
  if (upperIsLater) {
    return { line: upper.recordLines[0] ?? 0, message: `data at ${hexAddress(upper.start)} overlaps data given earlier.` };
  }
  const index = lastIndexAtOrBelow(lower.recordStarts, upper.start);
  return {
    line: lower.recordLines[index] ?? 0,
    message: `data at ${hexAddress(lower.recordStarts[index] ?? upper.start)} overlaps data given earlier at ${hexAddress(upper.start)}.`,
  };
}

function lastIndexAtOrBelow(sorted: readonly number[], value: number): number {
  let lo = 0;
  let hi = sorted.length - 1;
  while (lo < hi) {
    const mid = (lo + hi + 1) >> 1;
    if (sorted[mid]! <= value) lo = mid;
    else hi = mid - 1;
  }
  return lo;
}

function joinRuns(runs: readonly Run[]): ImageSegment {
  const start = runs[0]!.start;
  const end = runs.at(-1)!.end;
  if (runs.length === 1) {
    return { start, data: runs[0]!.buffer.slice(0, end - start) };
  }
  const data = new Uint8Array(end - start);
  for (const run of runs) data.set(run.buffer.subarray(0, run.end - run.start), run.start - start);
  return { start, data };
}

/** Normalises any list of segments into a MemoryImage; overlapping segments are refused. */
export function createMemoryImage(segments: readonly ImageSegment[]): MemoryImage {
  const builder = new ImageBuilder('validation');
  for (const segment of segments) builder.add(segment.start, segment.data);
  return builder.build();
}

export function imageByteCount(image: MemoryImage): number {
  return image.segments.reduce((sum, segment) => sum + segment.data.length, 0);
}

/** The address ranges holding data, `end` EXCLUSIVE. */
export function imageRanges(image: MemoryImage): AddressRange[] {
  return image.segments.map((segment) => ({ start: segment.start, end: segment.start + segment.data.length }));
}

/** Index of the segment holding `address`, or -1. Binary search, so page views stay cheap on large images. */
export function segmentIndexAt(image: MemoryImage, address: number): number {
  const segments = image.segments;
  let lo = 0;
  let hi = segments.length - 1;
  while (lo <= hi) {
    const mid = (lo + hi) >> 1;
    const segment = segments[mid]!;
    if (address < segment.start) hi = mid - 1;
    else if (address >= segment.start + segment.data.length) lo = mid + 1;
    else return mid;
  }
  return -1;
}

/** The byte at `address`, or undefined where the image holds no data. */
export function imageByteAt(image: MemoryImage, address: number): number | undefined {
  const segment = image.segments[segmentIndexAt(image, address)];
  return segment === undefined ? undefined : segment.data[address - segment.start];
}

export function imagesEqual(a: MemoryImage, b: MemoryImage): boolean {
  if (a.segments.length !== b.segments.length) return false;
  return a.segments.every((segment, index) => {
    const other = b.segments[index]!;
    return segment.start === other.start && bytesEqual(segment.data, other.data);
  });
}

function bytesEqual(x: Uint8Array, y: Uint8Array): boolean {
  if (x.length !== y.length) return false;
  for (let i = 0; i < x.length; i += 1) if (x[i] !== y[i]) return false;
  return true;
}
