import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { arbitraryImage, byteMap, catchDomainError, segmentEntries } from './calibration.fixtures';
import { generateCalibrationImage, reviseImage } from './demo-image';
import { diffImages, pageDiffRanges } from './image-diff';
import type { DiffRange } from './image-diff';
import { createMemoryImage } from './memory-image';
import type { MemoryImage } from './memory-image';

/** Independent reference: every address of either image, compared one by one through plain Maps. */
function changedAddresses(a: MemoryImage, b: MemoryImage): { changed: number[]; compared: number } {
  const left = byteMap(segmentEntries(a));
  const right = byteMap(segmentEntries(b));
  const addresses = [...new Set([...left.keys(), ...right.keys()])].sort((x, y) => x - y);
  return { changed: addresses.filter((address) => left.get(address) !== right.get(address)), compared: addresses.length };
}

/** Independent reference grouping: a change joins the previous range when at most `gap` addresses lie between. */
function groupChanges(changed: readonly number[], gap: number): DiffRange[] {
  const ranges: DiffRange[] = [];
  for (const address of changed) {
    const last = ranges.at(-1);
    if (last !== undefined && address - last.end <= gap) {
      last.end = address + 1;
      last.changedBytes += 1;
    } else {
      ranges.push({ start: address, end: address + 1, changedBytes: 1 });
    }
  }
  return ranges;
}

const bytes = (...values: number[]) => new Uint8Array(values);

describe('diffImages', () => {
  it('finds nothing between an image and itself', () => {
    // [CALC]
    fc.assert(
      fc.property(arbitraryImage(0xffff_0000), (image) => {
        const diff = diffImages(image, image);
        expect(diff.changedBytes).toBe(0);
        expect(diff.ranges).toEqual([]);
      }),
    );
  });

  it('matches a byte-by-byte reference on random pairs, at any merge gap', () => {
    // ranges cover every changed byte and only those groups; bytes in one image only count as changed [CALC]
    fc.assert(
      fc.property(arbitraryImage(0x2000, 5), arbitraryImage(0x2000, 5), fc.integer({ min: 0, max: 40 }), (a, b, mergeGap) => {
        const reference = changedAddresses(a, b);
        const diff = diffImages(a, b, { mergeGap });
        expect(diff.changedBytes).toBe(reference.changed.length);
        expect(diff.comparedBytes).toBe(reference.compared);
        expect(diff.ranges).toEqual(groupChanges(reference.changed, mergeGap));
      }),
    );
  });

  it('matches the reference when scattered bytes of an image are changed', () => {
    // [CALC]
    fc.assert(
      fc.property(arbitraryImage(0x2000, 5), fc.array(fc.nat(), { maxLength: 30 }), fc.integer({ min: 0, max: 40 }), (a, picks, mergeGap) => {
        const b = createMemoryImage(a.segments.map((segment) => ({ start: segment.start, data: segment.data.slice() })));
        for (const pick of picks) {
          const segment = b.segments[pick % b.segments.length]!;
          const at = pick % segment.data.length;
          segment.data[at] = segment.data[at]! ^ 0x5a;
        }
        expect(diffImages(a, b, { mergeGap }).ranges).toEqual(groupChanges(changedAddresses(a, b).changed, mergeGap));
      }),
    );
  });

  it('merges changes at most mergeGap apart and splits wider gaps', () => {
    const base = new Uint8Array(64);
    const changed = base.slice();
    changed[10] = 1;
    changed[27] = 1; // 16 unchanged bytes (11–26) between
    changed[45] = 1; // 17 unchanged bytes (28–44) between
    const a = createMemoryImage([{ start: 0x100, data: base }]);
    const b = createMemoryImage([{ start: 0x100, data: changed }]);
    // gap counted as unchanged addresses between two changes [CALC]
    expect(diffImages(a, b).ranges).toEqual([
      { start: 0x10a, end: 0x11c, changedBytes: 2 },
      { start: 0x12d, end: 0x12e, changedBytes: 1 },
    ]);
    expect(diffImages(a, b, { mergeGap: 0 }).ranges).toHaveLength(3);
    expect(diffImages(a, b, { mergeGap: 17 }).ranges).toEqual([{ start: 0x10a, end: 0x12e, changedBytes: 3 }]);
  });

  it('counts bytes present in one image only as changed', () => {
    const a = createMemoryImage([{ start: 0, data: bytes(1, 2, 3, 4) }]);
    const b = createMemoryImage([
      { start: 2, data: bytes(3, 4, 5, 6) },
      { start: 100, data: bytes(7) },
    ]);
    const diff = diffImages(a, b, { mergeGap: 0 });
    // addresses 0–5 and 100: 7 compared; 0, 1, 4, 5, 100 changed [CALC]
    expect(diff).toEqual({
      changedBytes: 5,
      comparedBytes: 7,
      changedShare: 5 / 7,
      ranges: [
        { start: 0, end: 2, changedBytes: 2 },
        { start: 4, end: 6, changedBytes: 2 },
        { start: 100, end: 101, changedBytes: 1 },
      ],
    });
  });

  it('diffs two 4 MiB images quickly and reports the revised regions', () => {
    const a = generateCalibrationImage({ seed: 3, size: 4 * 1024 * 1024, baseAddress: 0x8_0000 });
    const b = reviseImage(a, { seed: 4, edits: 10 });
    const started = performance.now();
    const diff = diffImages(a, b);
    const elapsed = performance.now() - started;
    expect(diff.comparedBytes).toBe(4 * 1024 * 1024);
    expect(diff.ranges.length).toBeGreaterThan(0);
    expect(diff.ranges.length).toBeLessThanOrEqual(10);
    // generous bound for a shared 2-core machine; scripts/bench/calibration-diff.ts measures properly
    expect(elapsed).toBeLessThan(1000);
  });

  it('refuses a negative or fractional merge gap', () => {
    const image = createMemoryImage([]);
    expect(catchDomainError(() => diffImages(image, image, { mergeGap: -1 })).code).toBe('validation');
  });
});

describe('pageDiffRanges', () => {
  const ranges = Array.from({ length: 45 }, (_, index) => ({ start: index * 100, end: index * 100 + 1, changedBytes: 1 }));

  it('returns one 1-based page and the totals', () => {
    const page = pageDiffRanges(ranges, 3, 20);
    expect(page.ranges.map((range) => range.start)).toEqual([4000, 4100, 4200, 4300, 4400]);
    expect(page).toMatchObject({ page: 3, pageSize: 20, totalRanges: 45, pageCount: 3 });
    expect(pageDiffRanges(ranges, 4, 20).ranges).toEqual([]);
  });

  it('refuses page 0 and a page size below 1', () => {
    expect(catchDomainError(() => pageDiffRanges(ranges, 0, 20)).code).toBe('validation');
    expect(catchDomainError(() => pageDiffRanges(ranges, 1, 0)).code).toBe('validation');
  });
});
