import zlib from 'node:zlib';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { ascii } from './calibration.fixtures';
import { crc32, formatCrc32, imageCrc32 } from './crc32';
import { createMemoryImage } from './memory-image';

describe('crc32', () => {
  it('gives the catalogue check value for "123456789"', () => {
    // CRC-32/ISO-HDLC check value, CRC catalogue (reveng) [3P]
    expect(crc32(ascii('123456789'))).toBe(0xcbf43926);
    expect(formatCrc32(crc32(ascii('123456789')))).toBe('CBF43926');
  });

  it('is 0 for no bytes', () => {
    // empty input: init 0xFFFFFFFF xor-out 0xFFFFFFFF [CALC]
    expect(crc32(new Uint8Array(0))).toBe(0);
  });

  it('matches Node zlib.crc32 on random data, whole and incremental', () => {
    // Node zlib.crc32 (zlib's implementation) as an independent oracle [3P]
    expect(typeof zlib.crc32).toBe('function');
    fc.assert(
      fc.property(fc.uint8Array({ maxLength: 2000 }), fc.uint8Array({ maxLength: 500 }), (head, tail) => {
        expect(crc32(head)).toBe(zlib.crc32(head));
        const whole = new Uint8Array([...head, ...tail]);
        expect(crc32(tail, crc32(head))).toBe(zlib.crc32(whole));
        expect(crc32(tail, zlib.crc32(head))).toBe(zlib.crc32(tail, zlib.crc32(head)));
      }),
    );
  });

  it('runs over an image in address order and skips gaps', () => {
    const image = createMemoryImage([
      { start: 0x200, data: ascii('6789') },
      { start: 0x100, data: ascii('12345') },
    ]);
    // gaps are not filled, so the image CRC is the CRC of the bytes in address order [CALC], value [3P]
    expect(imageCrc32(image)).toBe(0xcbf43926);
  });
});
