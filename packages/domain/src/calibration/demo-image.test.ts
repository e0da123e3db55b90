import { describe, expect, it } from 'vitest';
import { catchDomainError } from './calibration.fixtures';
import { generateCalibrationImage, reviseImage } from './demo-image';
import { diffImages } from './image-diff';
import { imagesEqual } from './memory-image';

describe('generateCalibrationImage', () => {
  const image = generateCalibrationImage({ seed: 42, size: 64 * 1024, baseAddress: 0x8000 });
  const data = image.segments[0]!.data;

  it('is deterministic per seed and sits at the base address', () => {
    expect(imagesEqual(image, generateCalibrationImage({ seed: 42, size: 64 * 1024, baseAddress: 0x8000 }))).toBe(true);
    expect(imagesEqual(image, generateCalibrationImage({ seed: 43, size: 64 * 1024, baseAddress: 0x8000 }))).toBe(false);
    expect(image.segments[0]!.start).toBe(0x8000);
    expect(data.length).toBe(64 * 1024);
  });

  it('looks like a calibration: identifier text first, erased padding at the end', () => {
    expect(new TextDecoder().decode(data.subarray(0, 24))).toBe('REVLOOP DEMO CALIBRATION');
    expect(data.subarray(data.length - 1024).every((byte) => byte === 0xff)).toBe(true);
  });

  it('refuses sizes and bases that do not fit', () => {
    expect(catchDomainError(() => generateCalibrationImage({ seed: 1, size: 10, baseAddress: 0 })).code).toBe('validation');
    expect(catchDomainError(() => generateCalibrationImage({ seed: 1, size: 4096, baseAddress: 0xffff_f000 + 1 })).code).toBe('validation');
  });
});

describe('reviseImage', () => {
  const image = generateCalibrationImage({ seed: 5, size: 256 * 1024, baseAddress: 0 });

  it('changes a few regions, deterministically, leaving the input untouched', () => {
    const before = Buffer.from(image.segments[0]!.data);
    const revised = reviseImage(image, { seed: 9, edits: 4 });
    const diff = diffImages(image, revised, { mergeGap: 0 });
    expect(diff.changedBytes).toBeGreaterThan(0);
    expect(diff.changedBytes).toBeLessThanOrEqual(4 * 64);
    expect(diffImages(image, revised, { mergeGap: 64 }).ranges.length).toBeLessThanOrEqual(4);
    expect(imagesEqual(revised, reviseImage(image, { seed: 9, edits: 4 }))).toBe(true);
    expect(Buffer.from(image.segments[0]!.data).equals(before)).toBe(true);
  });

  it('with no edits returns an equal image', () => {
    expect(imagesEqual(reviseImage(image, { seed: 1, edits: 0 }), image)).toBe(true);
  });
});
