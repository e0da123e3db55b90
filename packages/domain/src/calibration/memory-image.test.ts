import { describe, expect, it } from 'vitest';
import { catchDomainError } from './calibration.fixtures';
import { createMemoryImage, imageByteAt, imageByteCount, imageRanges, imagesEqual } from './memory-image';

const bytes = (...values: number[]) => new Uint8Array(values);

describe('MemoryImage', () => {
  const image = createMemoryImage([
    { start: 0x20, data: bytes(5, 6) },
    { start: 0x10, data: bytes(1, 2) },
    { start: 0x12, data: bytes(3, 4) },
  ]);

  it('sorts segments and merges adjacent ones', () => {
    expect(image.segments.map((segment) => [segment.start, [...segment.data]])).toEqual([
      [0x10, [1, 2, 3, 4]],
      [0x20, [5, 6]],
    ]);
  });

  it('counts bytes, lists ranges with an exclusive end and looks bytes up', () => {
    expect(imageByteCount(image)).toBe(6);
    expect(imageRanges(image)).toEqual([
      { start: 0x10, end: 0x14 },
      { start: 0x20, end: 0x22 },
    ]);
    expect(imageByteAt(image, 0x13)).toBe(4);
    expect(imageByteAt(image, 0x14)).toBeUndefined();
    expect(imageByteAt(image, 0x21)).toBe(6);
  });

  it('compares by bytes at addresses, not by how segments were given', () => {
    const same = createMemoryImage([
      { start: 0x10, data: bytes(1, 2, 3, 4) },
      { start: 0x20, data: bytes(5, 6) },
    ]);
    expect(imagesEqual(image, same)).toBe(true);
    expect(imagesEqual(image, createMemoryImage([{ start: 0x10, data: bytes(1, 2, 3, 4) }]))).toBe(false);
    expect(imagesEqual(image, createMemoryImage([{ start: 0x10, data: bytes(1, 2, 3, 4) }, { start: 0x20, data: bytes(5, 7) }]))).toBe(false);
  });

  it('refuses overlapping segments and addresses beyond 32 bits', () => {
    const overlap = catchDomainError(() => createMemoryImage([{ start: 0, data: bytes(1, 2) }, { start: 1, data: bytes(3) }]));
    expect(overlap.code).toBe('validation');
    expect(overlap.message).toMatch(/overlaps/);
    expect(catchDomainError(() => createMemoryImage([{ start: 0xffff_ffff, data: bytes(1, 2) }])).message).toMatch(/32-bit address space/);
  });
});
