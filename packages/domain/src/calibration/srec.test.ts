import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { arbitraryImage, catchDomainError } from './calibration.fixtures';
import { parseIntelHex } from './intel-hex';
import { createMemoryImage, imagesEqual } from './memory-image';
import { parseSrec, toSrec } from './srec';

describe('parseSrec', () => {
  it('reads the published S1 record as the same image as its Intel HEX twin', () => {
    // S107FEDC210080CFAE and :04FEDC00210080CFB2 hold the same bytes (published side-by-side example) [3P];
    // the S9 end record's checksum FC = ~(03) [CALC]
    const srec = parseSrec('S107FEDC210080CFAE\nS9030000FC\n');
    const hex = parseIntelHex(':04FEDC00210080CFB2\n:00000001FF\n');
    expect(imagesEqual(srec.image, hex.image)).toBe(true);
    expect(srec.image.segments[0]!.start).toBe(0xfedc);
    expect([...srec.image.segments[0]!.data]).toEqual([0x21, 0x00, 0x80, 0xcf]);
  });

  it('keeps the S0 header text, checks the S5 count and reads the end address', () => {
    // S0 "HDR" = 48 44 52; checksums are the ones' complement of the byte sum (Motorola S-record format) [MEM], sums checked in Python [CALC]
    const file = parseSrec('S00600004844521B\nS107FEDC210080CFAE\nS5030001FB\nS9031234B6\n');
    expect(file.header).toBe('HDR');
    expect(file.startAddress).toBe(0x1234);
  });

  it('reads 24- and 32-bit data records', () => {
    const file = parseSrec('S2060123450A0A7C\nS30708000000FFFFF2\nS70500000000FA\n');
    expect(file.image.segments.map((segment) => segment.start)).toEqual([0x01_2345, 0x0800_0000]);
  });

  it('round-trips any image at every address width', () => {
    // parse(write(x)) = x [CALC]
    const widths = [
      { addressBytes: 2, maxBase: 0xf000 },
      { addressBytes: 3, maxBase: 0xff_0000 },
      { addressBytes: 4, maxBase: 0xfff0_0000 },
    ] as const;
    for (const { addressBytes, maxBase } of widths) {
      fc.assert(
        fc.property(arbitraryImage(maxBase), fc.string({ maxLength: 40, unit: fc.constantFrom(...'ABC xyz-09.') }), (image, header) => {
          const file = parseSrec(toSrec(image, { addressBytes, header }));
          expect(imagesEqual(file.image, image)).toBe(true);
          expect(file.header).toBe(header);
        }),
        { numRuns: 60 },
      );
    }
  });
});

describe('toSrec', () => {
  it('picks the narrowest address width and writes S5 then the matching end record', () => {
    const lines = toSrec(createMemoryImage([{ start: 0xfedc, data: new Uint8Array([0x21, 0x00, 0x80, 0xcf]) }])).trim().split('\n');
    // first line equals the published record [3P]; S5/S9 checksums [CALC]
    expect(lines).toEqual(['S107FEDC210080CFAE', 'S5030001FB', 'S9030000FC']);
  });

  it('writes an S6 count above 65 535 records', () => {
    const image = createMemoryImage([{ start: 0, data: new Uint8Array(0x10000 + 1) }]);
    const text = toSrec(image, { recordLength: 1 });
    // 65 537 records: 0x010001 in an S6 record [CALC]
    expect(text).toContain('\nS604010001F9\n');
    expect(imagesEqual(parseSrec(text).image, image)).toBe(true);
  });

  it('refuses an address width too small for the image', () => {
    const image = createMemoryImage([{ start: 0x1_0000, data: new Uint8Array(1) }]);
    expect(catchDomainError(() => toSrec(image, { addressBytes: 2 })).code).toBe('validation');
  });
});

describe('parseSrec refuses bad input', () => {
  const reject = (text: string) => catchDomainError(() => parseSrec(text));

  it('refuses empty text and a missing end record', () => {
    expect(reject('').message).toMatch(/no S-records/);
    expect(reject('S107FEDC210080CFAE\n').message).toMatch(/no S7\/S8\/S9 end record/);
  });

  it('refuses a wrong length byte, naming the line', () => {
    const error = reject('S00600004844521B\nS108FEDC210080CFAE\nS9030000FC');
    expect(error.code).toBe('invalid_file');
    expect(error.details).toEqual({ line: 2 });
    expect(error.message).toMatch(/length byte says 8 bytes follow but the record holds 7/);
  });

  it('refuses a bad checksum, naming the line', () => {
    const error = reject('S107FEDC210080CFAF\nS9030000FC');
    expect(error.details).toEqual({ line: 1 });
    expect(error.message).toMatch(/checksum AF .*expected AE/);
  });

  it('refuses a count record that disagrees, truncated and garbled records, S4 and data after the end', () => {
    expect(reject('S107FEDC210080CFAE\nS5030002FA\nS9030000FC').message).toMatch(/count record says 2 data records but the file holds 1/);
    expect(reject('S1030000\nS9030000FC').message).toMatch(/truncated/);
    expect(reject('S107FEDC21OO80CFAE\nS9030000FC').message).toMatch(/character "O" at column 11/);
    expect(reject('S4030000FC\nS9030000FC').message).toMatch(/reserved/);
    expect(reject('X107FEDC210080CFAE').message).toMatch(/does not start with "S"/);
    expect(reject('S9030000FC\nS107FEDC210080CFAE').details).toEqual({ line: 2 });
  });
});
