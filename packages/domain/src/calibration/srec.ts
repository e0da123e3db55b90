import { DomainError } from '../errors';
import { ImageBuilder, imageRanges } from './memory-image';
import type { MemoryImage } from './memory-image';
import { bigEndianBytes, byteHex, byteSum, checkRecordLength, decodeHexDigits, forEachLine, lineError, onesComplement, readBigEndian, RecordWriter } from './record-text';

export type SrecAddressBytes = 2 | 3 | 4;

export interface SrecFile {
  image: MemoryImage;
  /** The S0 header's data as text, when the file has one. */
  header?: string;
  /** The address in the S7/S8/S9 end record. */
  startAddress?: number;
}

// Address field width by record type; S4 is reserved and has none.
const ADDRESS_BYTES: Record<string, SrecAddressBytes> = { '0': 2, '1': 2, '2': 3, '3': 4, '5': 2, '6': 3, '7': 4, '8': 3, '9': 2 };
const DATA_TYPE: Record<SrecAddressBytes, string> = { 2: '1', 3: '2', 4: '3' };
const END_TYPE: Record<SrecAddressBytes, string> = { 2: '9', 3: '8', 4: '7' };

/**
 * Parses Motorola S-records: S0 header, S1/S2/S3 data (16/24/32-bit addresses), S5/S6 record count
 * (checked against the data records before it), S7/S8/S9 end. The checksum is the ones' complement
 * of the byte sum of count, address and data. The first bad record is reported with its line; an
 * end record is required so that a file cut short is refused.
 */
export function parseSrec(text: string): SrecFile {
  const builder = new ImageBuilder();
  const scratch = { bytes: new Uint8Array(256) };
  let header: string | undefined;
  let startAddress: number | undefined;
  let endLine = 0;
  let dataRecords = 0;
  let records = 0;
  forEachLine(text, (from, to, line) => {
    if (endLine > 0) throw lineError(line, `there is data after the end record on line ${endLine}.`);
    if (text[from] !== 'S') throw lineError(line, 'the record does not start with "S"; this is not an S-record.');
    const type = from + 1 < to ? text[from + 1]! : '';
    if (type === '4') throw lineError(line, 'S4 is a reserved record type.');
    const addressBytes = ADDRESS_BYTES[type];
    if (addressBytes === undefined) throw lineError(line, `"S${type}" is not an S-record type (S0–S9).`);
    const bytes = decodeHexDigits(text, from + 2, to, line, scratch);
    if (bytes.length < 1) throw lineError(line, 'the record is truncated: it has no length byte.');
    const count = bytes[0]!;
    if (count !== bytes.length - 1) {
      throw lineError(line, `the length byte says ${count} bytes follow but the record holds ${bytes.length - 1}; it is truncated or garbled.`);
    }
    if (count < addressBytes + 1) throw lineError(line, `the record is truncated: an S${type} record needs ${addressBytes} address bytes and a checksum.`);
    const expected = onesComplement(byteSum(bytes, 0, bytes.length - 1));
    if (bytes[bytes.length - 1] !== expected) {
      throw lineError(line, `checksum ${byteHex(bytes[bytes.length - 1]!)} does not match the record (expected ${byteHex(expected)}).`);
    }
    records += 1;
    const address = readBigEndian(bytes, 1, addressBytes);
    const data = bytes.subarray(1 + addressBytes, bytes.length - 1);
    switch (type) {
      case '0':
        header ??= String.fromCharCode(...data).replace(/\0+$/, '');
        break;
      case '1':
      case '2':
      case '3':
        builder.add(address, data, line);
        dataRecords += 1;
        break;
      case '5':
      case '6':
        if (address !== dataRecords) {
          throw lineError(line, `the count record says ${address} data records but the file holds ${dataRecords} before it.`);
        }
        break;
      default:
        startAddress = address;
        endLine = line;
    }
  });
  if (records === 0) throw new DomainError('invalid_file', 'The file holds no S-records.');
  if (endLine === 0) throw new DomainError('invalid_file', 'The file has no S7/S8/S9 end record; it may have been cut short.');
  const result: SrecFile = { image: builder.build() };
  if (header !== undefined) result.header = header;
  if (startAddress !== undefined) result.startAddress = startAddress;
  return result;
}

export interface SrecWriteOptions {
  /** Address width: 2 (S1/S9), 3 (S2/S8) or 4 (S3/S7); default the narrowest that holds the image. */
  addressBytes?: SrecAddressBytes;
  /** Text for an S0 header record (ASCII); no S0 record when absent. */
  header?: string;
  /** Data bytes per record, default 16. */
  recordLength?: number;
}

function record(writer: RecordWriter, type: string, address: number, addressBytes: number, data: readonly number[] | Uint8Array): void {
  writer.record(`S${type}`, [addressBytes + data.length + 1, ...bigEndianBytes(address, addressBytes)], data, onesComplement);
}

function narrowestAddressBytes(lastAddress: number): SrecAddressBytes {
  if (lastAddress <= 0xffff) return 2;
  return lastAddress <= 0xff_ffff ? 3 : 4;
}

function headerBytes(header: string, max: number): number[] {
  const bytes = [...header].map((char) => char.charCodeAt(0));
  if (bytes.some((code) => code < 0x20 || code > 0x7e) || bytes.length > max) {
    throw new DomainError('validation', `An S0 header must be printable ASCII of at most ${max} characters.`);
  }
  return bytes;
}

/**
 * Writes S-records: optional S0 header, data records, an S5 (or S6 above 65 535 records) count
 * record, and the end record matching the address width, with start address 0. LF line ends.
 */
export function toSrec(image: MemoryImage, options: SrecWriteOptions = {}): string {
  const lastAddress = (imageRanges(image).at(-1)?.end ?? 1) - 1;
  const addressBytes = options.addressBytes ?? narrowestAddressBytes(lastAddress);
  if (addressBytes < narrowestAddressBytes(lastAddress)) {
    throw new DomainError('validation', `${addressBytes}-byte S-record addresses cannot reach the image's last address 0x${lastAddress.toString(16).toUpperCase()}.`);
  }
  const maxData = 255 - addressBytes - 1;
  const recordLength = options.recordLength ?? 16;
  checkRecordLength(recordLength, maxData);
  const writer = new RecordWriter();
  if (options.header !== undefined) record(writer, '0', 0, 2, headerBytes(options.header, 255 - 3));
  let dataRecords = 0;
  for (const segment of image.segments) {
    for (let position = 0; position < segment.data.length; position += recordLength) {
      const chunk = segment.data.subarray(position, position + recordLength);
      record(writer, DATA_TYPE[addressBytes], segment.start + position, addressBytes, chunk);
      dataRecords += 1;
    }
  }
  if (dataRecords <= 0xffff) record(writer, '5', dataRecords, 2, []);
  else if (dataRecords <= 0xff_ffff) record(writer, '6', dataRecords, 3, []);
  record(writer, END_TYPE[addressBytes], 0, addressBytes, []);
  return writer.toString();
}
