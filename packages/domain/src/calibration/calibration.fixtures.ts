import fc from 'fast-check';
import { DomainError } from '../errors';
import { createMemoryImage } from './memory-image';
import type { MemoryImage } from './memory-image';

// Shared by the calibration tests only; nothing here is part of the public API.

/** Runs `action` and returns the DomainError it throws; anything else fails the test. */
export function catchDomainError(action: () => unknown): DomainError {
  try {
    action();
  } catch (error) {
    if (error instanceof DomainError) return error;
    throw error;
  }
  throw new Error('expected a DomainError, but nothing was thrown');
}

/** Random images: up to `maxSegments` blocks with random gaps (0 gives adjacent blocks) from a base ≤ `maxBase`. */
export function arbitraryImage(maxBase: number, maxSegments = 6): fc.Arbitrary<MemoryImage> {
  return fc
    .record({
      base: fc.integer({ min: 0, max: maxBase }),
      blocks: fc.array(fc.record({ gap: fc.integer({ min: 0, max: 300 }), data: fc.uint8Array({ minLength: 1, maxLength: 200 }) }), {
        minLength: 1,
        maxLength: maxSegments,
      }),
    })
    .map(({ base, blocks }) => {
      let at = base;
      const segments = blocks.map(({ gap, data }) => {
        const start = at + gap;
        at = start + data.length;
        return { start, data };
      });
      return createMemoryImage(segments);
    });
}

/** Address → byte, built by hand so tests can check results without the code under test. */
export function byteMap(blocks: Iterable<readonly [number, Uint8Array]>): Map<number, number> {
  const bytes = new Map<number, number>();
  for (const [start, data] of blocks) data.forEach((byte, index) => bytes.set(start + index, byte));
  return bytes;
}

export const segmentEntries = (image: MemoryImage): [number, Uint8Array][] => image.segments.map((segment) => [segment.start, segment.data]);

export const ascii = (text: string): Uint8Array => new TextEncoder().encode(text);
