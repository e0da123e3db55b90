import { DomainError } from '../errors';
import { ADDRESS_LIMIT } from './memory-image';
import type { MemoryImage } from './memory-image';

// Invented demo content: a deterministic image that looks like a calibration (identifier text, a
// code-like block, many 2-D maps of 16-bit big-endian values with axes, 0xFF padding). It names no product.

/** mulberry32: a small, fast, deterministic 32-bit generator; plenty for demo bytes. */
function random(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 0x1_0000_0000;
  };
}

const between = (next: () => number, lo: number, hi: number): number => lo + Math.floor(next() * (hi - lo + 1));

class Writer {
  position = 0;
  constructor(readonly data: Uint8Array) {}
  get room(): number {
    return this.data.length - this.position;
  }
  u16(value: number): void {
    this.data[this.position] = (value >> 8) & 0xff;
    this.data[this.position + 1] = value & 0xff;
    this.position += 2;
  }
  text(value: string, fieldLength: number): void {
    for (let i = 0; i < fieldLength; i += 1) this.data[this.position + i] = i < value.length ? value.charCodeAt(i) : 0;
    this.position += fieldLength;
  }
  pad(alignment: number, extra: number): void {
    this.position = Math.min(this.data.length, Math.ceil((this.position + extra) / alignment) * alignment);
  }
}

function writeIdentifiers(writer: Writer, next: () => number, seed: number): void {
  const digits = (count: number): string => Array.from({ length: count }, () => between(next, 0, 9)).join('');
  writer.text('REVLOOP DEMO CALIBRATION', 32);
  writer.text(`PN DM${digits(8)}`, 16);
  writer.text(`CAL ${(seed >>> 0).toString(16).toUpperCase().padStart(8, '0')}`, 16);
  writer.text(`SW ${between(next, 1, 9)}.${digits(2)}`, 16);
  writer.pad(256, 0);
}

function writeCodeBlock(writer: Writer, next: () => number, length: number): void {
  for (let i = 0; i < length && writer.room > 0; i += 1) writer.data[writer.position++] = Math.floor(next() * 256);
  writer.pad(256, 0);
}

/** A map: row and column counts, two rising axes, then a smooth surface with a little noise. */
function writeMap(writer: Writer, next: () => number): boolean {
  const rows = between(next, 4, 16);
  const columns = between(next, 4, 16);
  if (writer.room < 4 + 2 * (rows + columns + rows * columns)) return false;
  writer.u16(rows);
  writer.u16(columns);
  const columnStep = between(next, 100, 600);
  const rowStep = between(next, 5, 20);
  for (let c = 0; c < columns; c += 1) writer.u16(500 + c * columnStep);
  for (let r = 0; r < rows; r += 1) writer.u16(20 + r * rowStep);
  const base = between(next, 200, 20000);
  const slopeColumn = between(next, -300, 300);
  const slopeRow = between(next, -300, 300);
  for (let r = 0; r < rows; r += 1) {
    for (let c = 0; c < columns; c += 1) {
      const value = base + slopeColumn * c + slopeRow * r + between(next, -20, 20);
      writer.u16(Math.max(0, Math.min(0xfffe, value)));
    }
  }
  return true;
}

export interface DemoImageOptions {
  seed: number;
  size: number;
  baseAddress: number;
}

/** A deterministic image of `size` bytes at `baseAddress`: the same seed gives the same bytes. */
export function generateCalibrationImage({ seed, size, baseAddress }: DemoImageOptions): MemoryImage {
  if (!Number.isInteger(size) || size < 1024 || size > 64 * 1024 * 1024) throw new DomainError('validation', 'Demo image size must be 1 KiB to 64 MiB.');
  if (!Number.isInteger(baseAddress) || baseAddress < 0 || baseAddress + size > ADDRESS_LIMIT) {
    throw new DomainError('validation', 'Demo image must fit the 32-bit address space.');
  }
  const next = random(seed);
  const writer = new Writer(new Uint8Array(size).fill(0xff));
  writeIdentifiers(writer, next, seed);
  writeCodeBlock(writer, next, Math.floor(size / 8));
  // Maps fill about three quarters of the image; the rest stays erased (0xFF) as padding.
  const mapsEnd = Math.floor(size * 0.75);
  while (writer.position < mapsEnd && writeMap(writer, next)) writer.pad(16, between(next, 0, 48));
  return { segments: [{ start: baseAddress, data: writer.data }] };
}

export interface ReviseOptions {
  seed: number;
  /** How many table regions to change. */
  edits: number;
}

const MAX_ATTEMPTS_PER_EDIT = 50;

/**
 * A revised copy of `image`: `edits` regions of 16-bit values, chosen away from 0xFF padding, are
 * scaled by a few per cent, as a tuner's table change would. The input is left untouched.
 */
export function reviseImage(image: MemoryImage, { seed, edits }: ReviseOptions): MemoryImage {
  if (!Number.isInteger(edits) || edits < 0) throw new DomainError('validation', `edits must be a whole number ≥ 0; got ${edits}.`);
  const next = random(seed);
  const segments = image.segments.map((segment) => ({ start: segment.start, data: segment.data.slice() }));
  const total = segments.reduce((sum, segment) => sum + segment.data.length, 0);
  for (let edit = 0; edit < edits && total >= 2; edit += 1) {
    for (let attempt = 0; attempt < MAX_ATTEMPTS_PER_EDIT; attempt += 1) {
      if (scaleRegion(segments, total, next)) break;
    }
  }
  return { segments };
}

function scaleRegion(segments: readonly { data: Uint8Array }[], total: number, next: () => number): boolean {
  let pick = Math.floor(next() * total);
  const segment = segments.find((candidate) => (pick -= candidate.data.length) < 0);
  if (segment === undefined || segment.data.length < 2) return false;
  const data = segment.data;
  const words = Math.min(between(next, 4, 32), data.length >> 1);
  const from = 2 * between(next, 0, (data.length >> 1) - words);
  const to = from + 2 * words;
  if (data.subarray(from, to).every((byte) => byte === 0xff)) return false;
  const factor = 1 + (between(next, 2, 8) / 100) * (next() < 0.5 ? -1 : 1);
  for (let at = from; at < to; at += 2) {
    const value = (data[at]! << 8) | data[at + 1]!;
    if (value === 0xffff) continue;
    const scaled = Math.max(0, Math.min(0xfffe, Math.round(value * factor)));
    const revised = scaled === value ? (value + 1) % 0xffff : scaled;
    data[at] = revised >> 8;
    data[at + 1] = revised & 0xff;
  }
  return true;
}
