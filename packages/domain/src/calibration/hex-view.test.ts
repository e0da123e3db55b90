import { describe, expect, it } from 'vitest';
import { catchDomainError } from './calibration.fixtures';
import { hexView } from './hex-view';
import { createMemoryImage } from './memory-image';

const text = (value: string) => new TextEncoder().encode(value);

describe('hexView', () => {
  const a = createMemoryImage([{ start: 0x1000, data: new Uint8Array([...text('CAL 0001 ENGINE'), 0x00, 0x01, 0xff]) }]);
  const b = createMemoryImage([
    { start: 0x1000, data: text('CAL 0002 ENGINE') },
    { start: 0x1012, data: new Uint8Array([0x41]) },
  ]);

  it('aligns rows to the width and marks changed cells side by side', () => {
    const rows = hexView(a, b, { start: 0x1007, end: 0x1013 });
    expect(rows.map((row) => row.address)).toEqual([0x1000, 0x1010]);
    const [first, second] = rows;
    // ASCII codes: "1" = 0x31, "2" = 0x32 (ANSI X3.4) [STD]
    expect(first!.left[7]).toBe(0x31);
    expect(first!.right[7]).toBe(0x32);
    expect(first!.changed.map((changed, index) => (changed ? index : -1)).filter((index) => index >= 0)).toEqual([7, 15]);
    expect(first!.leftText).toBe('CAL 0001 ENGINE.');
    expect(first!.rightText).toBe('CAL 0002 ENGINE ');
    // no data → null cell and a blank in the text column; unprintable → "." [CP]
    expect(second!.left.slice(0, 4)).toEqual([0x01, 0xff, null, null]);
    expect(second!.right.slice(0, 4)).toEqual([null, null, 0x41, null]);
    expect(second!.changed.slice(0, 4)).toEqual([true, true, true, false]);
    expect(second!.leftText.slice(0, 4)).toBe('..  ');
    expect(second!.rightText.slice(0, 4)).toBe('  A ');
  });

  it('honours the width and caps a long range at pageBytes', () => {
    expect(hexView(a, b, { start: 0x1000, end: 0x1012 }, { width: 8 })).toHaveLength(3);
    expect(hexView(a, b, { start: 0, end: 0x1_0000 }, { pageBytes: 64 })).toHaveLength(4);
  });

  it('refuses a bad width or range', () => {
    expect(catchDomainError(() => hexView(a, b, { start: 0, end: 16 }, { width: 0 })).code).toBe('validation');
    expect(catchDomainError(() => hexView(a, b, { start: 16, end: 0 })).code).toBe('validation');
  });
});
