import { DomainError } from '../errors';

export interface CsvLayout {
  /** Byte value of the field delimiter: comma, semicolon or tab. */
  delimiter: number;
  /** Numbers written "12,5" (only with a semicolon or tab delimiter). */
  decimalComma: boolean;
  headers: string[];
  /** Byte offset of the first data row. */
  dataStart: number;
  /** Mean length of the sampled data rows in bytes, to size the column arrays up front. */
  bytesPerRow: number;
}

export type ColumnArray = Float64Array | Float32Array;

export interface ColumnRequest {
  column: number;
  /** Time needs doubles (hours of log at millisecond resolution); other channels fit single precision. */
  float64: boolean;
}

const COMMA = 0x2c;
const TAB = 0x09;
const QUOTE = 0x22;
const LF = 0x0a;
const CR = 0x0d;
const SPACE = 0x20;
const DOT = 0x2e;
const COLON = 0x3a;
const MINUS = 0x2d;
const PLUS = 0x2b;
const ZERO = 0x30;
const NINE = 0x39;

/** Enough lines to get past any logger preamble and still see data rows. */
const SAMPLE_BYTES = 256 * 1024;
const MAX_HEADER_LINE = 60;
const DATA_LINES_CHECKED = 20;
const BINARY_PROBE_BYTES = 8192;

const POW10 = Array.from({ length: 23 }, (_, i) => 10 ** i);

function fail(message: string): never {
  throw new DomainError('invalid_datalog', message);
}

function assertText(bytes: Uint8Array): void {
  const probe = bytes.subarray(0, BINARY_PROBE_BYTES);
  let control = 0;
  for (const b of probe) {
    if (b === 0) fail('This file is not a CSV log: it contains binary data.');
    if (b < SPACE && b !== TAB && b !== LF && b !== CR) control++;
  }
  if (control > probe.length * 0.02) fail('This file is not a CSV log: it contains binary data.');
}

function decodeLine(bytes: Uint8Array): string {
  try {
    return new TextDecoder('utf-8', { fatal: true }).decode(bytes);
  } catch {
    // Older Windows loggers write "°F" in Windows-1252, which is not valid UTF-8.
    return new TextDecoder('windows-1252').decode(bytes);
  }
}

/** Lines of the sample region by byte offset, so the data start is a byte position in the original buffer. */
function sampleLines(
  bytes: Uint8Array,
  start: number,
): { text: string; start: number; bytes: number }[] {
  const end = Math.min(bytes.length, start + SAMPLE_BYTES);
  const lines: { text: string; start: number; bytes: number }[] = [];
  let lineStart = start;
  for (let i = start; i < end; i++) {
    const b = bytes[i];
    if (b !== LF && b !== CR) continue;
    lines.push({
      text: decodeLine(bytes.subarray(lineStart, i)),
      start: lineStart,
      bytes: i - lineStart,
    });
    if (b === CR && bytes[i + 1] === LF) i++;
    lineStart = i + 1;
  }
  // A line cut off by the sample window is incomplete; keep it only when it is the end of the file.
  if (end === bytes.length && lineStart < end) {
    lines.push({
      text: decodeLine(bytes.subarray(lineStart, end)),
      start: lineStart,
      bytes: end - lineStart,
    });
  }
  return lines.filter((l) => l.text.trim() !== '');
}

function splitFields(line: string, delimiter: string): string[] {
  const fields: string[] = [];
  let current = '';
  let quoted = false;
  for (let i = 0; i < line.length; i++) {
    const c = line[i];
    if (c === '"') {
      if (quoted && line[i + 1] === '"') {
        current += '"';
        i++;
      } else quoted = !quoted;
    } else if (c === delimiter && !quoted) {
      fields.push(current.trim());
      current = '';
    } else current += c;
  }
  fields.push(current.trim());
  return fields;
}

const NUMBER_DOT =
  /^[-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?$|^\d{1,2}:\d{2}(?::\d{2})?(?:\.\d+)?$/;
const NUMBER_COMMA =
  /^[-+]?(?:\d+,?\d*|,\d+)(?:[eE][-+]?\d+)?$|^\d{1,2}:\d{2}(?::\d{2})?(?:,\d+)?$/;

interface Candidate {
  delimiter: string;
  headerIndex: number;
  unitsRow: boolean;
  dataIndex: number;
  width: number;
  decimalComma: boolean;
}

function tryCandidate(
  lines: { text: string }[],
  headerIndex: number,
  delimiter: string,
): Candidate | 'header_only' | null {
  const headerLine = lines[headerIndex];
  if (headerLine === undefined) return null;
  const header = splitFields(headerLine.text, delimiter);
  const width = header.length;
  const isNumber = (cell: string) =>
    NUMBER_DOT.test(cell) || (delimiter !== ',' && NUMBER_COMMA.test(cell));
  const textCells = header.filter((c) => c !== '' && !isNumber(c)).length;
  if (width < 2 || textCells < Math.max(2, width / 2)) return null;
  if (headerIndex === lines.length - 1) return 'header_only';

  let dataIndex = headerIndex + 1;
  const next = lines[dataIndex];
  const nextCells = next === undefined ? [] : splitFields(next.text, delimiter);
  const unitsRow =
    nextCells.length === width &&
    nextCells.every((c) => c === '' || !isNumber(c)) &&
    dataIndex + 1 < lines.length;
  if (unitsRow) dataIndex++;

  const dataLines = lines.slice(dataIndex, dataIndex + DATA_LINES_CHECKED);
  if (dataLines.length === 0) return 'header_only';
  let good = 0;
  let judged = 0;
  let commaDecimals = 0;
  let dotDecimals = 0;
  for (const line of dataLines) {
    const cells = splitFields(line.text, delimiter);
    // Single-cell lines are comments or footers ("End of log"), not evidence either way.
    if (cells.length < 2) continue;
    judged++;
    if (cells.length > width + 1) continue;
    const filled = cells.filter((c) => c !== '');
    const numeric = filled.filter(isNumber);
    if (numeric.length === 0 || numeric.length < filled.length / 2) continue;
    good++;
    for (const c of numeric) {
      if (/\d,\d/.test(c)) commaDecimals++;
      else if (/\d\.\d/.test(c)) dotDecimals++;
    }
  }
  if (good === 0 || good < judged * 0.8) return null;
  return {
    delimiter,
    headerIndex,
    unitsRow,
    dataIndex,
    width,
    decimalComma: delimiter !== ',' && commaDecimals > dotDecimals,
  };
}

/** Finds the delimiter, the header row (after any preamble, with an optional units row) and the number format. */
export function detectCsvLayout(bytes: Uint8Array): CsvLayout {
  if (bytes.length === 0) fail('The file is empty.');
  assertText(bytes);
  const bomLength = bytes[0] === 0xef && bytes[1] === 0xbb && bytes[2] === 0xbf ? 3 : 0;
  const lines = sampleLines(bytes, bomLength);
  if (lines.length === 0) fail('The file is empty.');

  let headerOnly = false;
  for (let i = 0; i < Math.min(lines.length, MAX_HEADER_LINE); i++) {
    const found: Candidate[] = [];
    for (const delimiter of [',', ';', '\t']) {
      const candidate = tryCandidate(lines, i, delimiter);
      if (candidate === 'header_only') headerOnly = true;
      else if (candidate !== null) found.push(candidate);
    }
    const best = found.sort((a, b) => b.width - a.width)[0];
    if (best === undefined) continue;
    const headerLine = lines[best.headerIndex];
    const dataLine = lines[best.dataIndex];
    if (headerLine === undefined || dataLine === undefined) continue;
    let headers = splitFields(headerLine.text, best.delimiter);
    const unitsLine = lines[best.headerIndex + 1];
    if (best.unitsRow && unitsLine !== undefined) {
      const units = splitFields(unitsLine.text, best.delimiter);
      headers = headers.map((h, k) => (units[k] && !/[([]/.test(h) ? `${h} (${units[k]})` : h));
    }
    const sampled = lines.slice(best.dataIndex, best.dataIndex + DATA_LINES_CHECKED);
    const bytesPerRow = sampled.reduce((sum, l) => sum + l.bytes + 1, 0) / sampled.length;
    return {
      delimiter: best.delimiter.charCodeAt(0),
      decimalComma: best.decimalComma,
      headers: headers.map((h, k) => h || `Column ${k + 1}`),
      dataStart: dataLine.start,
      bytesPerRow,
    };
  }
  if (headerOnly) fail('The log has a header row but no data rows.');
  fail(
    `No header row followed by rows of numbers was found in the first ${MAX_HEADER_LINE} lines; is this a CSV datalog?`,
  );
}

function grow<T extends ColumnArray>(array: T, size: number): T {
  const next = new (array.constructor as new (n: number) => T)(size);
  next.set(array);
  return next;
}

/**
 * Parses the requested columns straight from the bytes: one pass, no strings per row. Blank or non-numeric
 * cells become NaN; rows whose requested cells are all blank (footers, comments) are skipped.
 */
export function parseCsvColumns(
  bytes: Uint8Array,
  layout: CsvLayout,
  requests: readonly ColumnRequest[],
  onProgress?: (fraction: number) => void,
): { rows: number; columns: ColumnArray[] } {
  const n = bytes.length;
  const delimiter = layout.delimiter;
  const decimal = layout.decimalComma ? COMMA : DOT;
  const width = Math.max(layout.headers.length, ...requests.map((r) => r.column + 1));
  const slot = new Int32Array(width + 1).fill(-1);
  requests.forEach((r, i) => (slot[r.column] = i));
  const wanted = requests.length;

  let capacity = Math.ceil(((n - layout.dataStart) / Math.max(1, layout.bytesPerRow)) * 1.05) + 16;
  const columns: ColumnArray[] = requests.map((r) =>
    r.float64 ? new Float64Array(capacity) : new Float32Array(capacity),
  );
  const step = Math.max(1 << 20, Math.floor(n / 100));
  let nextReport = layout.dataStart + step;

  let rows = 0;
  let pos = layout.dataStart;
  while (pos < n) {
    let b = bytes[pos] as number;
    if (b === LF || b === CR) {
      pos++;
      continue;
    }
    if (rows === capacity) {
      capacity = Math.ceil(capacity * 1.5) + 16;
      for (let i = 0; i < wanted; i++) columns[i] = grow(columns[i] as ColumnArray, capacity);
    }
    let col = 0;
    let numericCells = 0;
    // One field per iteration; the loop ends at the line end.
    for (;;) {
      const target = col < width ? (slot[col] as number) : -1;
      if (target < 0) {
        let quoted = false;
        while (pos < n) {
          b = bytes[pos] as number;
          if (b === QUOTE) quoted = !quoted;
          else if (!quoted && (b === delimiter || b === LF || b === CR)) break;
          pos++;
        }
      } else {
        while (pos < n && (bytes[pos] === SPACE || bytes[pos] === QUOTE)) pos++;
        let negative = false;
        b = bytes[pos] as number;
        if (b === MINUS || b === PLUS) {
          negative = b === MINUS;
          pos++;
        }
        let mantissa = 0;
        let fractionDigits = 0;
        let digits = 0;
        let inFraction = false;
        let clock = 0;
        let exponent = 0;
        let valid = true;
        while (pos < n) {
          b = bytes[pos] as number;
          if (b >= ZERO && b <= NINE) {
            mantissa = mantissa * 10 + (b - ZERO);
            digits++;
            if (inFraction) fractionDigits++;
          } else if (b === decimal && !inFraction) {
            inFraction = true;
          } else if (b === COLON && !inFraction && digits > 0) {
            // h:mm:ss clock times become seconds.
            clock = (clock + mantissa) * 60;
            mantissa = 0;
          } else if ((b === 0x65 || b === 0x45) && digits > 0) {
            pos++;
            let expNegative = false;
            if (bytes[pos] === MINUS || bytes[pos] === PLUS) {
              expNegative = bytes[pos] === MINUS;
              pos++;
            }
            while (pos < n && (bytes[pos] as number) >= ZERO && (bytes[pos] as number) <= NINE) {
              exponent = exponent * 10 + ((bytes[pos] as number) - ZERO);
              pos++;
            }
            if (expNegative) exponent = -exponent;
            break;
          } else break;
          pos++;
        }
        while (pos < n && (bytes[pos] === SPACE || bytes[pos] === QUOTE)) pos++;
        b = bytes[pos] as number;
        if (pos < n && b !== delimiter && b !== LF && b !== CR) {
          valid = false;
          let quoted = false;
          while (pos < n) {
            b = bytes[pos] as number;
            if (b === QUOTE) quoted = !quoted;
            else if (!quoted && (b === delimiter || b === LF || b === CR)) break;
            pos++;
          }
        }
        let value = Number.NaN;
        if (valid && digits > 0) {
          value =
            fractionDigits < POW10.length
              ? mantissa / (POW10[fractionDigits] as number)
              : mantissa / 10 ** fractionDigits;
          value += clock;
          if (exponent > 0) value *= 10 ** exponent;
          else if (exponent < 0) value /= 10 ** -exponent;
          if (negative) value = -value;
          numericCells++;
        }
        (columns[target] as ColumnArray)[rows] = value;
      }
      if (pos < n && bytes[pos] === delimiter) {
        pos++;
        col++;
        continue;
      }
      break;
    }
    for (let c = col + 1; c < width; c++) {
      const target = slot[c] as number;
      if (target >= 0) (columns[target] as ColumnArray)[rows] = Number.NaN;
    }
    if (numericCells > 0 || wanted === 0) rows++;
    if (pos >= nextReport && onProgress) {
      onProgress(pos / n);
      nextReport = pos + step;
    }
  }
  onProgress?.(1);
  // Copy only when the size estimate was far off: the copy briefly doubles the memory the columns take.
  const trimmed = columns.map((c) =>
    c.length > rows * 1.5 + 64 ? c.slice(0, rows) : c.subarray(0, rows),
  );
  return { rows, columns: trimmed };
}
