import zlib from 'node:zlib';
import { describe, expect, it } from 'vitest';
import { ascii, catchDomainError } from './calibration.fixtures';
import { detectFormat, parseCalibration } from './calibration-file';
import { generateCalibrationImage } from './demo-image';
import { toIntelHex } from './intel-hex';
import { toSrec } from './srec';

const HEX = ':04FEDC00210080CFB2\n:00000001FF\n';
const SREC = 'S00600004844521B\nS107FEDC210080CFAE\nS9030000FC\n';
const BINARY = new Uint8Array([0x00, 0x01, 0xff, 0xfe, 0x10, 0x20]);

describe('detectFormat', () => {
  it('recognises Intel HEX, S-record and raw binary', () => {
    expect(detectFormat(ascii(HEX))).toBe('intel_hex');
    expect(detectFormat(ascii(`\r\n${SREC}`), 'read.s19')).toBe('srec');
    expect(detectFormat(BINARY, 'read.bin')).toBe('raw');
    // erased flash is all 0xFF: never valid UTF-8 text, so binary [CALC]
    expect(detectFormat(new Uint8Array(64).fill(0xff))).toBe('raw');
  });

  it('refuses an empty file', () => {
    const error = catchDomainError(() => detectFormat(new Uint8Array(0), 'read.bin'));
    expect(error.code).toBe('invalid_file');
    expect(error.message).toBe('The file is empty.');
  });

  it('refuses text that is neither format', () => {
    const error = catchDomainError(() => detectFormat(ascii('time,rpm\n0.0,850\n'), 'log.bin'));
    expect(error.code).toBe('invalid_file');
    expect(error.message).toMatch(/neither Intel HEX nor Motorola S-record/);
  });

  it('refuses binary content under a text-format name', () => {
    for (const name of ['read.hex', 'READ.S19', 'read.srec', 'read.mot']) {
      const error = catchDomainError(() => detectFormat(BINARY, name));
      expect(error.code).toBe('invalid_file');
      expect(error.message).toMatch(/a text format, but its content is binary/);
    }
  });
});

describe('parseCalibration', () => {
  it('summarises a text file: size, ranges (end exclusive), CRC-32, header', () => {
    const parsed = parseCalibration(ascii(SREC), 'read.s19');
    expect(parsed.format).toBe('srec');
    expect(parsed.sizeBytes).toBe(4);
    expect(parsed.ranges).toEqual([{ start: 0xfedc, end: 0xfee0 }]);
    // Node zlib.crc32 over the same bytes as an independent oracle [3P]
    expect(parsed.crc32).toBe(zlib.crc32(new Uint8Array([0x21, 0x00, 0x80, 0xcf])));
    expect(parsed.header).toBe('HDR');
    expect(parsed.startAddress).toBe(0);
  });

  it('reads a raw image at address 0 and the same image from either text format', () => {
    const image = generateCalibrationImage({ seed: 11, size: 8192, baseAddress: 0 });
    const data = image.segments[0]!.data;
    const raw = parseCalibration(data, 'read.bin');
    expect(raw).toMatchObject({ format: 'raw', sizeBytes: 8192, ranges: [{ start: 0, end: 8192 }] });
    // Node zlib.crc32 as oracle [3P]
    expect(raw.crc32).toBe(zlib.crc32(data));
    expect(parseCalibration(ascii(toIntelHex(image)), 'read.hex').crc32).toBe(raw.crc32);
    expect(parseCalibration(ascii(toSrec(image)), 'read.srec').crc32).toBe(raw.crc32);
  });

  it('refuses a text file without data and passes on parse errors with their line', () => {
    expect(catchDomainError(() => parseCalibration(ascii(':00000001FF\n'))).message).toMatch(/no data bytes/);
    const error = catchDomainError(() => parseCalibration(ascii(HEX.replace('CFB2', 'CFB3')), 'read.hex'));
    expect(error.details).toEqual({ line: 1 });
  });

  it('treats a non-ASCII character in a HEX file as garbled text, not as binary', () => {
    const error = catchDomainError(() => parseCalibration(ascii(HEX.replace('CF', 'Cé')), 'read.hex'));
    expect(error.message).toMatch(/^Line 1: character U\+00E9/);
  });
});
