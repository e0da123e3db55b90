import { DomainError } from '../errors';

// Helpers shared by the two text formats (Intel HEX and Motorola S-record): both are lines of hex byte pairs.

const NIBBLE = (() => {
  const table = new Int8Array(128).fill(-1);
  for (let n = 0; n < 16; n += 1) {
    table['0123456789abcdef'.charCodeAt(n)] = n;
    table['0123456789ABCDEF'.charCodeAt(n)] = n;
  }
  return table;
})();

const BYTE_HEX = Array.from({ length: 256 }, (_, n) => n.toString(16).toUpperCase().padStart(2, '0'));

export const byteHex = (value: number): string => BYTE_HEX[value & 0xff]!;

/** A blank line anywhere is tolerated (CRLF files and a trailing newline leave one). */
export function splitLines(text: string): string[] {
  return text.split(/\r\n|\r|\n/);
}

export function lineError(line: number, message: string): DomainError {
  return new DomainError('invalid_file', `Line ${line}: ${message}`, { line });
}

function showCharacter(char: string): string {
  const code = char.codePointAt(0) ?? 0;
  return code > 0x20 && code < 0x7f ? `"${char}"` : `U+${code.toString(16).toUpperCase().padStart(4, '0')}`;
}

/**
 * Decodes the hex digits of `text` from `from` to the end into `scratch` (grown when too small) and
 * returns the bytes. Refuses any non-hex character (naming its column) and an odd digit count.
 */
export function decodeHexDigits(text: string, from: number, line: number, scratch: { bytes: Uint8Array }): Uint8Array {
  const digits = text.length - from;
  for (let i = from; i < text.length; i += 1) {
    const code = text.charCodeAt(i);
    if (code >= 128 || NIBBLE[code] === -1) {
      throw lineError(line, `character ${showCharacter(text[i]!)} at column ${i + 1} is not a hex digit; the record is garbled.`);
    }
  }
  if (digits % 2 !== 0) {
    throw lineError(line, 'the record has an odd number of hex digits; it is truncated or garbled.');
  }
  const count = digits / 2;
  if (scratch.bytes.length < count) scratch.bytes = new Uint8Array(count);
  const out = scratch.bytes;
  for (let i = 0; i < count; i += 1) {
    const at = from + 2 * i;
    out[i] = (NIBBLE[text.charCodeAt(at)]! << 4) | NIBBLE[text.charCodeAt(at + 1)]!;
  }
  return out.subarray(0, count);
}

export function byteSum(bytes: Uint8Array, from: number, to: number): number {
  let sum = 0;
  for (let i = from; i < to; i += 1) sum += bytes[i]!;
  return sum & 0xff;
}

/** Reads `length` bytes at `from` as a big-endian unsigned number (up to 4 bytes). */
export function readBigEndian(bytes: Uint8Array, from: number, length: number): number {
  let value = 0;
  for (let i = 0; i < length; i += 1) value = value * 256 + bytes[from + i]!;
  return value;
}

/** One record line: `prefix` then each byte as two upper-case hex digits. */
export function formatRecord(prefix: string, bytes: readonly number[] | Uint8Array): string {
  let line = prefix;
  for (let i = 0; i < bytes.length; i += 1) line += BYTE_HEX[bytes[i]!]!;
  return line;
}

export function bigEndianBytes(value: number, length: number): number[] {
  const bytes: number[] = [];
  for (let i = length - 1; i >= 0; i -= 1) bytes.push(Math.floor(value / 256 ** i) & 0xff);
  return bytes;
}

export function checkRecordLength(recordLength: number, max: number): void {
  if (!Number.isInteger(recordLength) || recordLength < 1 || recordLength > max) {
    throw new DomainError('validation', `Record length must be a whole number from 1 to ${max}; got ${recordLength}.`);
  }
}
