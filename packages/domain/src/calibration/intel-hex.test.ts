import MemoryMap from 'nrf-intel-hex';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { arbitraryImage, byteMap, catchDomainError, segmentEntries } from './calibration.fixtures';
import { parseIntelHex, toIntelHex } from './intel-hex';
import { createMemoryImage, imageByteCount, imagesEqual } from './memory-image';

const EXAMPLE = ':10010000214601360121470136007EFE09D2190140\n:00000001FF\n';

describe('parseIntelHex', () => {
  it('reads the published data record and EOF record', () => {
    // Intel HEX example records as published (Wikipedia "Intel HEX", record examples) [3P]
    const { image } = parseIntelHex(EXAMPLE);
    expect(image.segments).toHaveLength(1);
    expect(image.segments[0]!.start).toBe(0x0100);
    expect([...image.segments[0]!.data]).toEqual([0x21, 0x46, 0x01, 0x36, 0x01, 0x21, 0x47, 0x01, 0x36, 0x00, 0x7e, 0xfe, 0x09, 0xd2, 0x19, 0x01]);
  });

  it('tolerates CRLF line ends, lower-case digits and a trailing blank line', () => {
    // same records as above; line-end tolerance is common practice among parsers (nrf-intel-hex README) [CP]
    const crlf = parseIntelHex(`${EXAMPLE.toLowerCase().replace(/\n/g, '\r\n')}\r\n`);
    expect(imagesEqual(crlf.image, parseIntelHex(EXAMPLE).image)).toBe(true);
    expect(imagesEqual(parseIntelHex(EXAMPLE.replace(/\n/g, '\r')).image, crlf.image)).toBe(true);
  });

  it('applies extended linear (04) and extended segment (02) addresses and reads start addresses (03, 05)', () => {
    // address = upper16 << 16 + offset for type 04; segment·16 + offset for type 02 (Intel HEX spec rev A) [MEM]
    const linear = parseIntelHex(':020000040800F2\n:0400000001020304F2\n:0400000508000131BD\n:00000001FF');
    expect(linear.image.segments[0]!.start).toBe(0x0800_0000);
    expect(linear.startAddress).toBe(0x0800_0131);
    const segment = parseIntelHex(':020000021000EC\n:0100100055 9A\n:0400000300001234B3\n:00000001FF'.replace(' ', ''));
    expect(segment.image.segments[0]!.start).toBe(0x1_0010);
    // CS·16 + IP = 0x0000·16 + 0x1234 [CALC]
    expect(segment.startAddress).toBe(0x1234);
  });

  it('agrees with nrf-intel-hex on random images, both ways', () => {
    // nrf-intel-hex 1.4.0 as an independent parser and writer [3P]; it keeps addresses as signed
    // 32-bit numbers, so this comparison stays below 2 GiB
    fc.assert(
      fc.property(arbitraryImage(0x7ff0_0000), (image) => {
        const ours = toIntelHex(image);
        expect(byteMap(MemoryMap.fromHex(ours))).toEqual(byteMap(segmentEntries(image)));
        const theirs = new MemoryMap(segmentEntries(image)).asHexString();
        expect(imagesEqual(parseIntelHex(theirs).image, image)).toBe(true);
      }),
      { numRuns: 150 },
    );
  });

  it('round-trips any image through its own writer at any record length', () => {
    // parse(write(x)) = x [CALC]
    fc.assert(
      fc.property(arbitraryImage(0xfff0_0000), fc.integer({ min: 1, max: 255 }), (image, recordLength) => {
        expect(imagesEqual(parseIntelHex(toIntelHex(image, { recordLength })).image, image)).toBe(true);
      }),
      { numRuns: 150 },
    );
  });
});

describe('toIntelHex', () => {
  it('writes type 04 records only above 64 KiB and splits records at the 64 KiB boundary', () => {
    const image = createMemoryImage([{ start: 0xfff8, data: new Uint8Array(16).fill(0xaa) }]);
    const lines = toIntelHex(image).trim().split('\n');
    // :LL AAAA TT data CC with CC = two's complement of the byte sum (Intel HEX spec) [MEM]; sums checked in Python [CALC]
    expect(lines).toEqual([
      ':08FFF800AAAAAAAAAAAAAAAAB1',
      ':020000040001F9',
      ':08000000AAAAAAAAAAAAAAAAA8',
      ':00000001FF',
    ]);
    expect(imageByteCount(parseIntelHex(lines.join('\n')).image)).toBe(16);
  });

  it('refuses a record length outside 1–255', () => {
    expect(catchDomainError(() => toIntelHex(createMemoryImage([]), { recordLength: 0 })).code).toBe('validation');
  });
});

describe('parseIntelHex refuses bad input', () => {
  const reject = (text: string) => catchDomainError(() => parseIntelHex(text));

  it('refuses empty text', () => {
    expect(reject('').code).toBe('invalid_file');
    expect(reject('\n\n').message).toMatch(/no Intel HEX records/);
  });

  it('reports a bad checksum with its line number, and nrf-intel-hex refuses it too', () => {
    // :10010000…40 has checksum 0x40 [3P]; 0x41 is wrong
    const bad = `:020000040000FA\n${EXAMPLE.replace('D2190140', 'D2190141')}`;
    const error = reject(bad);
    expect(error.code).toBe('invalid_file');
    expect(error.details).toEqual({ line: 2 });
    expect(error.message).toMatch(/^Line 2: checksum 41 .*expected 40/);
    // independent parser also rejects the record [3P]
    expect(() => MemoryMap.fromHex(bad)).toThrow();
  });

  it('reports the first bad record only', () => {
    const error = reject(':10010000214601360121470136007EFE09D2190141\n:10010000214601360121470136007EFE09D2190142\n:00000001FF');
    expect(error.details).toEqual({ line: 1 });
  });

  it('refuses a truncated record', () => {
    const cut = reject(':1001000021460136012147013600\n:00000001FF');
    expect(cut.details).toEqual({ line: 1 });
    expect(cut.message).toMatch(/length byte says 16 data bytes but the record holds/);
    expect(reject(':0000\n').message).toMatch(/truncated: too short/);
    expect(reject(':10010000214601360121470136007EFE09D219014\n').message).toMatch(/odd number of hex digits/);
  });

  it('refuses garbled characters and a missing start code, naming the line and column', () => {
    const garbled = reject(':00000001FF'.replace('01', '0G'));
    expect(garbled.message).toBe('Line 1: character "G" at column 9 is not a hex digit; the record is garbled.');
    expect(reject(`${EXAMPLE.trim()}\n`.replace(':00', ';00')).details).toEqual({ line: 2 });
    expect(reject(':10010000214601360121470136007EFE09D21901é0\n').message).toMatch(/U\+00E9/);
  });

  it('refuses a missing EOF record and data after it', () => {
    expect(reject(':10010000214601360121470136007EFE09D2190140\n').message).toMatch(/no end-of-file record/);
    const after = reject(`:00000001FF\n${EXAMPLE}`);
    expect(after.details).toEqual({ line: 2 });
    expect(after.message).toMatch(/after the end-of-file record on line 1/);
  });

  it('refuses overlapping data, naming the later record', () => {
    const twice = reject(`:0400000001020304F2\n:0400020001020304F0\n:00000001FF`);
    expect(twice.details).toEqual({ line: 2 });
    // an earlier-in-file block that a later run grows into: the record crossing into it is named
    const grown = reject(':0400040001020304EE\n:0400000001020304F2\n:0400040001020304EE\n:00000001FF');
    expect(grown.details).toEqual({ line: 3 });
  });

  it('refuses unknown record types, wrong fixed lengths and records crossing 64 KiB', () => {
    // checksums worked by hand: two's complement of the byte sum [CALC]
    expect(reject(':00000006FA\n:00000001FF').message).toMatch(/record type 06/);
    expect(reject(':0100000401FA\n:00000001FF').message).toMatch(/extended linear address record carries 2/);
    expect(reject(':02FFFF00AABB9B\n:00000001FF').message).toMatch(/64 KiB boundary/);
  });
});
