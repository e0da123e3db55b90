import { DomainError } from '../errors';
import { imageCrc32 } from './crc32';
import { parseIntelHex } from './intel-hex';
import { imageByteCount, imageRanges } from './memory-image';
import type { AddressRange, MemoryImage } from './memory-image';
import { parseSrec } from './srec';

export type CalibrationFormat = 'raw' | 'intel_hex' | 'srec';

export interface ParsedCalibration {
  format: CalibrationFormat;
  image: MemoryImage;
  /** Bytes held by the image (not the file size, and not counting gaps). */
  sizeBytes: number;
  /** Address ranges holding data, `end` exclusive. */
  ranges: AddressRange[];
  /** CRC-32 (IEEE) over the image's bytes in address order; gaps are skipped, not filled. */
  crc32: number;
  /** S-record S0 header text. */
  header?: string;
  startAddress?: number;
}

const TEXT_FORMAT_EXTENSIONS = ['.hex', '.ihex', '.ihx', '.s19', '.s28', '.s37', '.srec', '.mot'];
const utf8 = new TextDecoder('utf-8', { fatal: true });

function extensionOf(fileName: string | undefined): string {
  const dot = fileName?.lastIndexOf('.') ?? -1;
  return fileName !== undefined && dot >= 0 ? fileName.slice(dot).toLowerCase() : '';
}

// Control bytes other than tab, LF, FF and CR never occur in text, and an erased-flash 0xFF never occurs
// in UTF-8, so either marks a binary image.
const BINARY_BYTE = (() => {
  const table = new Uint8Array(256);
  for (let byte = 0; byte < 0x20; byte += 1) table[byte] = 1;
  for (const allowed of [0x09, 0x0a, 0x0c, 0x0d]) table[allowed] = 0;
  table[0x7f] = 1;
  return table;
})();

function isText(bytes: Uint8Array): boolean {
  for (let i = 0; i < bytes.length; i += 1) if (BINARY_BYTE[bytes[i]!] === 1) return false;
  try {
    utf8.decode(bytes);
    return true;
  } catch {
    return false;
  }
}

/**
 * Tells a raw binary image from Intel HEX and S-record text. Text that is neither, an empty file, and
 * binary content under a text-format extension (.hex, .s19, .srec, .mot …) are refused.
 */
export function detectFormat(bytes: Uint8Array, fileName?: string): CalibrationFormat {
  if (bytes.length === 0) throw new DomainError('invalid_file', 'The file is empty.');
  if (!isText(bytes)) {
    const extension = extensionOf(fileName);
    if (TEXT_FORMAT_EXTENSIONS.includes(extension)) {
      throw new DomainError(
        'invalid_file',
        `The file is named ${extension}, a text format, but its content is binary. Upload the raw image under a .bin name, or the text file itself.`,
      );
    }
    return 'raw';
  }
  const first = new TextDecoder().decode(bytes.subarray(0, 64)).trimStart();
  if (first.startsWith(':')) return 'intel_hex';
  if (/^S[0-9]/.test(first)) return 'srec';
  throw new DomainError('invalid_file', 'The file is text but neither Intel HEX nor Motorola S-record; a calibration must be one of those or a raw binary image.');
}

/** Detects the format, parses the file into a memory image and summarises it; an image with no data is refused. */
export function parseCalibration(bytes: Uint8Array, fileName?: string): ParsedCalibration {
  const format = detectFormat(bytes, fileName);
  let parsed: { image: MemoryImage; header?: string; startAddress?: number };
  if (format === 'raw') {
    parsed = { image: { segments: [{ start: 0, data: bytes.slice() }] } };
  } else {
    const text = new TextDecoder().decode(bytes);
    parsed = format === 'intel_hex' ? parseIntelHex(text) : parseSrec(text);
  }
  const sizeBytes = imageByteCount(parsed.image);
  if (sizeBytes === 0) throw new DomainError('invalid_file', 'The file holds no data bytes.');
  return { format, sizeBytes, ranges: imageRanges(parsed.image), crc32: imageCrc32(parsed.image), ...parsed };
}
