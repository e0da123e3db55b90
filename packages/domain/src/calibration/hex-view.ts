import { DomainError } from '../errors';
import { segmentIndexAt } from './memory-image';
import type { AddressRange, MemoryImage } from './memory-image';

export interface HexViewRow {
  /** Address of the row's first cell (a multiple of the width). */
  address: number;
  /** Byte per cell, null where the image holds no data. */
  left: (number | null)[];
  right: (number | null)[];
  changed: boolean[];
  /** Printable ASCII per cell: "." for other bytes, " " for no data. */
  leftText: string;
  rightText: string;
}

export interface HexViewOptions {
  /** Cells per row, default 16. */
  width?: number;
  /** Most bytes to show (rounded up to whole rows), default 4096, so a huge range stays one screen. */
  pageBytes?: number;
}

/** Reads `count` bytes from `address` on, null where the image has no data. */
function readCells(image: MemoryImage, address: number, count: number): (number | null)[] {
  const cells: (number | null)[] = [];
  let index = segmentIndexAt(image, address);
  for (let at = address; at < address + count; at += 1) {
    let segment = image.segments[index];
    if (segment === undefined || at < segment.start || at >= segment.start + segment.data.length) {
      index = segmentIndexAt(image, at);
      segment = image.segments[index];
    }
    cells.push(segment === undefined ? null : segment.data[at - segment.start]!);
  }
  return cells;
}

const asText = (cells: readonly (number | null)[]): string =>
  cells.map((cell) => (cell === null ? ' ' : cell >= 0x20 && cell < 0x7f ? String.fromCharCode(cell) : '.')).join('');

/**
 * Rows for a side-by-side hex and ASCII view of `range` (`end` exclusive) in images `a` and `b`.
 * Rows are aligned to the width, so the first row may start before `range.start`.
 */
export function hexView(a: MemoryImage, b: MemoryImage, range: AddressRange, { width = 16, pageBytes = 4096 }: HexViewOptions = {}): HexViewRow[] {
  if (!Number.isInteger(width) || width < 1 || width > 256) throw new DomainError('validation', `Width must be a whole number from 1 to 256; got ${width}.`);
  if (!Number.isInteger(pageBytes) || pageBytes < 1) throw new DomainError('validation', `pageBytes must be a whole number from 1; got ${pageBytes}.`);
  if (!(range.end >= range.start) || range.start < 0) throw new DomainError('validation', 'The range must have 0 ≤ start ≤ end.');
  const first = Math.floor(range.start / width) * width;
  const last = Math.min(range.end, first + Math.ceil(pageBytes / width) * width);
  const rows: HexViewRow[] = [];
  for (let address = first; address < last; address += width) {
    const left = readCells(a, address, width);
    const right = readCells(b, address, width);
    rows.push({
      address,
      left,
      right,
      changed: left.map((cell, index) => cell !== right[index]),
      leftText: asText(left),
      rightText: asText(right),
    });
  }
  return rows;
}
