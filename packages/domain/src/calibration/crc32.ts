import type { MemoryImage } from './memory-image';

// CRC-32 as in IEEE 802.3 / zlib: reflected polynomial 0xEDB88320, initial value and final XOR 0xFFFFFFFF.
const TABLE = (() => {
  const table = new Uint32Array(256);
  for (let n = 0; n < 256; n += 1) {
    let c = n;
    for (let k = 0; k < 8; k += 1) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
    table[n] = c >>> 0;
  }
  return table;
})();

/**
 * CRC-32 of `bytes`. Pass an earlier result as `seed` to continue it, so
 * `crc32(b, crc32(a)) === crc32(a ++ b)` (the same convention as zlib's `crc32(data, value)`).
 */
export function crc32(bytes: Uint8Array, seed = 0): number {
  let crc = ~seed >>> 0;
  for (let i = 0; i < bytes.length; i += 1) {
    crc = TABLE[(crc ^ bytes[i]!) & 0xff]! ^ (crc >>> 8);
  }
  return ~crc >>> 0;
}

/** CRC-32 over the image's bytes in address order; gaps between segments are skipped, never filled. */
export function imageCrc32(image: MemoryImage): number {
  return image.segments.reduce((crc, segment) => crc32(segment.data, crc), 0);
}

export const formatCrc32 = (crc: number): string => crc.toString(16).toUpperCase().padStart(8, '0');
