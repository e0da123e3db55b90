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

const HEX_CODES = new TextEncoder().encode('0123456789ABCDEF');
const BYTE_HEX = Array.from({ length: 256 }, (_, n) => n.toString(16).toUpperCase().padStart(2, '0'));

export const byteHex = (value: number): string => BYTE_HEX[value & 0xff]!;

const LF = 0x0a;
const isTrailingSpace = (code: number): boolean => code === 0x20 || code === 0x09 || code === 0x0d;

/**
 * Calls `visit` with the bounds of each non-blank line (trailing spaces, tabs and CR trimmed) and its
 * 1-based number. LF and CRLF line ends are accepted (CR alone in a file without LF), blank lines are
 * skipped so a trailing newline is harmless. Works on indexes: a 4 MiB image is 260 000 lines.
 */
export function forEachLine(text: string, visit: (from: number, to: number, line: number) => void): void {
  const lineBreak = text.includes('\n') ? '\n' : '\r';
  let from = 0;
  let line = 1;
  while (from < text.length) {
    let end = text.indexOf(lineBreak, from);
    if (end === -1) end = text.length;
    let to = end;
    while (to > from && isTrailingSpace(text.charCodeAt(to - 1))) to -= 1;
    if (to > from) visit(from, to, line);
    from = end + 1;
    line += 1;
  }
}

export function lineError(line: number, message: string): DomainError {
  return new DomainError('invalid_file', `Line ${line}: ${message}`, { line });
}

function showCharacter(char: string): string {
  const code = char.codePointAt(0) ?? 0;
  return code > 0x20 && code < 0x7f ? `"${char}"` : `U+${code.toString(16).toUpperCase().padStart(4, '0')}`;
}

/**
 * Decodes the hex digits of `text` from `from` to `to` into `scratch` (grown when too small) and
 * returns the bytes. Refuses any non-hex character (naming its column) and an odd digit count.
 */
export function decodeHexDigits(text: string, from: number, to: number, line: number, scratch: { bytes: Uint8Array }): Uint8Array {
  const count = (to - from) >> 1;
  if (scratch.bytes.length < count) scratch.bytes = new Uint8Array(count);
  const out = scratch.bytes;
  for (let i = 0; i < count; i += 1) {
    const at = from + 2 * i;
    const high = nibbleAt(text, at, line);
    out[i] = (high << 4) | nibbleAt(text, at + 1, line);
  }
  if ((to - from) % 2 !== 0) {
    nibbleAt(text, to - 1, line);
    throw lineError(line, 'the record has an odd number of hex digits; it is truncated or garbled.');
  }
  return out.subarray(0, count);
}

function nibbleAt(text: string, at: number, line: number): number {
  const code = text.charCodeAt(at);
  const value = code < 128 ? NIBBLE[code]! : -1;
  if (value === -1) {
    throw lineError(line, `character ${showCharacter(text[at]!)} at column ${at + 1} is not a hex digit; the record is garbled.`);
  }
  return value;
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

/** Builds record text as ASCII bytes, decoded to a string once: far cheaper than joining 260 000 strings. */
export class RecordWriter {
  private bytes = new Uint8Array(1 << 16);
  private length = 0;

  /** Writes `prefix`, the `head` bytes, the data, the checksum `checksum` derives from the low byte of their sum, and LF. */
  record(prefix: string, head: readonly number[], data: readonly number[] | Uint8Array, checksum: (sum: number) => number): void {
    this.reserve(prefix.length + 2 * (head.length + data.length + 1) + 1);
    for (let i = 0; i < prefix.length; i += 1) this.bytes[this.length++] = prefix.charCodeAt(i);
    let sum = 0;
    for (const byte of head) {
      this.hex(byte);
      sum += byte;
    }
    for (let i = 0; i < data.length; i += 1) {
      this.hex(data[i]!);
      sum += data[i]!;
    }
    this.hex(checksum(sum & 0xff));
    this.bytes[this.length++] = LF;
  }

  toString(): string {
    return new TextDecoder().decode(this.bytes.subarray(0, this.length));
  }

  private hex(byte: number): void {
    this.bytes[this.length++] = HEX_CODES[byte >> 4]!;
    this.bytes[this.length++] = HEX_CODES[byte & 0xf]!;
  }

  private reserve(extra: number): void {
    if (this.length + extra <= this.bytes.length) return;
    const grown = new Uint8Array(Math.max(this.bytes.length * 2, this.length + extra));
    grown.set(this.bytes.subarray(0, this.length));
    this.bytes = grown;
  }
}

export const twosComplement = (sum: number): number => (0x100 - sum) & 0xff;
export const onesComplement = (sum: number): number => ~sum & 0xff;

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
