import { DomainError } from '../errors';
import { ImageBuilder, hexAddress } from './memory-image';
import type { MemoryImage } from './memory-image';
import { bigEndianBytes, byteHex, byteSum, checkRecordLength, decodeHexDigits, forEachLine, lineError, readBigEndian, RecordWriter, twosComplement } from './record-text';

export interface IntelHexFile {
  image: MemoryImage;
  /** From a type 05 record (EIP) or a type 03 record (CS·16 + IP), when the file has one. */
  startAddress?: number;
}

const RECORD_TYPE_NAMES: Record<number, string> = {
  0x00: 'data',
  0x01: 'end-of-file',
  0x02: 'extended segment address',
  0x03: 'start segment address',
  0x04: 'extended linear address',
  0x05: 'start linear address',
};
// Data length each non-data record type must carry.
const FIXED_LENGTH: Record<number, number> = { 0x01: 0, 0x02: 2, 0x03: 4, 0x04: 2, 0x05: 4 };
const OVERHEAD = 5; // length, address (2), type, checksum
const SEGMENT_SIZE = 0x1_0000;

/**
 * Parses Intel HEX (record types 00–05). Every record is checked for its start code, hex digits,
 * length byte and checksum; the first bad record is reported with its 1-based line number in the
 * message and in `details.line`. A data record may not run past a 64 KiB boundary (the format
 * leaves wrap-around undefined), data may not overlap, and the file must end with an EOF record.
 */
export function parseIntelHex(text: string): IntelHexFile {
  const builder = new ImageBuilder();
  const scratch = { bytes: new Uint8Array(OVERHEAD + 255) };
  let base = 0;
  let startAddress: number | undefined;
  let endLine = 0;
  let records = 0;
  forEachLine(text, (from, to, line) => {
    if (endLine > 0) throw lineError(line, `there is data after the end-of-file record on line ${endLine}.`);
    if (text[from] !== ':') throw lineError(line, 'the record does not start with ":"; this is not an Intel HEX record.');
    const bytes = decodeHexDigits(text, from + 1, to, line, scratch);
    if (bytes.length < OVERHEAD) throw lineError(line, 'the record is truncated: too short to hold length, address, type and checksum.');
    const length = bytes[0]!;
    if (length !== bytes.length - OVERHEAD) {
      throw lineError(line, `the length byte says ${length} data bytes but the record holds ${bytes.length - OVERHEAD}; it is truncated or garbled.`);
    }
    const expected = twosComplement(byteSum(bytes, 0, bytes.length - 1));
    if (bytes[bytes.length - 1] !== expected) {
      throw lineError(line, `checksum ${byteHex(bytes[bytes.length - 1]!)} does not match the record (expected ${byteHex(expected)}).`);
    }
    records += 1;
    const type = bytes[3]!;
    const name = RECORD_TYPE_NAMES[type];
    if (name === undefined) throw lineError(line, `record type ${byteHex(type)} is not an Intel HEX record type (00–05).`);
    const fixed = FIXED_LENGTH[type];
    if (fixed !== undefined && length !== fixed) throw lineError(line, `a ${name} record carries ${fixed} data bytes, not ${length}.`);
    const offset = readBigEndian(bytes, 1, 2);
    switch (type) {
      case 0x00:
        if (offset + length > SEGMENT_SIZE) {
          throw lineError(line, `the data record at offset ${hexAddress(offset)} runs past the 64 KiB boundary.`);
        }
        builder.add(base + offset, bytes.subarray(4, 4 + length), line);
        break;
      case 0x01:
        endLine = line;
        break;
      case 0x02:
        base = readBigEndian(bytes, 4, 2) * 16;
        break;
      case 0x03:
        startAddress = readBigEndian(bytes, 4, 2) * 16 + readBigEndian(bytes, 6, 2);
        break;
      case 0x04:
        base = readBigEndian(bytes, 4, 2) * SEGMENT_SIZE;
        break;
      case 0x05:
        startAddress = readBigEndian(bytes, 4, 4);
        break;
    }
  });
  if (records === 0) throw new DomainError('invalid_file', 'The file holds no Intel HEX records.');
  if (endLine === 0) {
    throw new DomainError('invalid_file', 'The file has no end-of-file record (:00000001FF); it may have been cut short.');
  }
  const image = builder.build();
  return startAddress === undefined ? { image } : { image, startAddress };
}

function record(writer: RecordWriter, type: number, offset: number, data: readonly number[] | Uint8Array): void {
  writer.record(':', [data.length, ...bigEndianBytes(offset, 2), type], data, twosComplement);
}

/**
 * Writes Intel HEX with `recordLength` data bytes per record (default 16), a type 04 record whenever
 * the upper 16 address bits change (so none below 64 KiB), records split at 64 KiB boundaries, LF
 * line ends and a closing EOF record.
 */
export function toIntelHex(image: MemoryImage, { recordLength = 16 }: { recordLength?: number } = {}): string {
  checkRecordLength(recordLength, 255);
  const writer = new RecordWriter();
  let upper = 0;
  for (const segment of image.segments) {
    let position = 0;
    while (position < segment.data.length) {
      const address = segment.start + position;
      const high = Math.floor(address / SEGMENT_SIZE);
      if (high !== upper) {
        record(writer, 0x04, 0, bigEndianBytes(high, 2));
        upper = high;
      }
      const low = address % SEGMENT_SIZE;
      const count = Math.min(recordLength, segment.data.length - position, SEGMENT_SIZE - low);
      record(writer, 0x00, low, segment.data.subarray(position, position + count));
      position += count;
    }
  }
  record(writer, 0x01, 0, []);
  return writer.toString();
}
