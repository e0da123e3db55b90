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

/**
 * A log read in pieces, so a 90 MB file never sits in memory whole: its first bytes (at least CSV_HEAD_BYTES, or
 * the whole file) to find the layout, then every byte of the file in order.
 */
export interface CsvSource {
  head: Uint8Array;
  byteLength: number;
  /** The file from its first byte; a piece may be overwritten once the next one is asked for. */
  chunks: () => Iterable<Uint8Array>;
}

/** The whole file as bytes, or the file read in pieces. */
export type CsvInput = Uint8Array | CsvSource;

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

/** Enough bytes to get past any logger preamble and still see data rows. */
export const CSV_HEAD_BYTES = 256 * 1024;
const MAX_HEADER_LINE = 60;
const DATA_LINES_CHECKED = 20;
/** Lines the layout search can look at: the last possible header, its units row and the data lines it checks. */
const SAMPLE_LINES = MAX_HEADER_LINE + DATA_LINES_CHECKED + 2;
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

const UTF8 = new TextDecoder('utf-8', { fatal: true });
// Made on first use: setting up a legacy decoder costs milliseconds, a tenth of a small log's whole analysis.
let windows1252: InstanceType<typeof TextDecoder> | undefined;

function decodeLine(bytes: Uint8Array): string {
  try {
    return UTF8.decode(bytes);
  } catch {
    // Older Windows loggers write "°F" in Windows-1252, which is not valid UTF-8.
    windows1252 ??= new TextDecoder('windows-1252');
    return windows1252.decode(bytes);
  }
}

const isBlank = (bytes: Uint8Array, from: number, to: number) => {
  for (let i = from; i < to; i++) if (bytes[i] !== SPACE && bytes[i] !== TAB) return false;
  return true;
};

/**
 * The first non-blank lines by byte offset, so the data start is a byte position in the file. Only as many as the
 * layout search can use are decoded; `complete` says whether the file has no more lines.
 */
function sampleLines(
  bytes: Uint8Array,
  start: number,
  wholeFile: boolean,
): { lines: { text: string; start: number; bytes: number }[]; complete: boolean } {
  const end = Math.min(bytes.length, start + CSV_HEAD_BYTES);
  const lines: { text: string; start: number; bytes: number }[] = [];
  const add = (from: number, to: number) => {
    if (!isBlank(bytes, from, to))
      lines.push({ text: decodeLine(bytes.subarray(from, to)), start: from, bytes: to - from });
  };
  let lineStart = start;
  for (let i = start; i < end && lines.length < SAMPLE_LINES; i++) {
    const b = bytes[i];
    if (b !== LF && b !== CR) continue;
    add(lineStart, i);
    if (b === CR && bytes[i + 1] === LF) i++;
    lineStart = i + 1;
  }
  if (lines.length >= SAMPLE_LINES)
    return { lines: lines.filter((l) => l.text.trim() !== ''), complete: false };
  // A line cut off by the sample window is incomplete; keep it only when it is the end of the file.
  const atEnd = wholeFile && end === bytes.length;
  if (atEnd && lineStart < end) add(lineStart, end);
  return { lines: lines.filter((l) => l.text.trim() !== ''), complete: atEnd };
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
/** ISO 8601 calendar date, optionally with a time of day and zone: a time stamp counts as a reading. */
const DATE_TIME =
  /^\d{4}-\d{2}-\d{2}(?:[T ]\d{2}:\d{2}(?::\d{2}(?:[.,]\d+)?)?(?:Z|[-+]\d{2}(?::?\d{2})?)?)?$/;

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
  complete: boolean,
  headerIndex: number,
  delimiter: string,
): Candidate | 'header_only' | null {
  const headerLine = lines[headerIndex];
  if (headerLine === undefined) return null;
  const header = splitFields(headerLine.text, delimiter);
  const width = header.length;
  const isNumber = (cell: string) =>
    NUMBER_DOT.test(cell) || (delimiter !== ',' && NUMBER_COMMA.test(cell)) || DATE_TIME.test(cell);
  const textCells = header.filter((c) => c !== '' && !isNumber(c)).length;
  if (width < 2 || textCells < Math.max(2, width / 2)) return null;
  if (complete && headerIndex === lines.length - 1) return 'header_only';

  let dataIndex = headerIndex + 1;
  const next = lines[dataIndex];
  const nextCells = next === undefined ? [] : splitFields(next.text, delimiter);
  const unitsRow =
    nextCells.length === width &&
    nextCells.every((c) => c === '' || !isNumber(c)) &&
    dataIndex + 1 < lines.length;
  if (unitsRow) dataIndex++;

  const dataLines = lines.slice(dataIndex, dataIndex + DATA_LINES_CHECKED);
  if (dataLines.length === 0) return complete ? 'header_only' : null;
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

/**
 * Finds the delimiter, the header row (after any preamble, with an optional units row) and the number format.
 * Bytes shorter than the file (a head) are fine as long as they reach the first data rows.
 */
export function detectCsvLayout(input: CsvInput): CsvLayout {
  const bytes = input instanceof Uint8Array ? input : input.head;
  const wholeFile = input instanceof Uint8Array || input.head.length >= input.byteLength;
  if (bytes.length === 0) fail('The file is empty.');
  assertText(bytes);
  const bomLength = bytes[0] === 0xef && bytes[1] === 0xbb && bytes[2] === 0xbf ? 3 : 0;
  const { lines, complete } = sampleLines(bytes, bomLength, wholeFile);
  if (lines.length === 0) fail('The file is empty.');

  let headerOnly = false;
  for (let i = 0; i < Math.min(lines.length, MAX_HEADER_LINE); i++) {
    const found: Candidate[] = [];
    for (const delimiter of [',', ';', '\t']) {
      const candidate = tryCandidate(lines, complete, i, delimiter);
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

/** What a column held: plain numbers, clock times (h:mm:ss) or ISO 8601 date-times. */
export type CellKind = 'number' | 'clock' | 'date_time';

export interface ParsedColumns {
  rows: number;
  columns: ColumnArray[];
  /** Per requested column: time stamps are seconds already, whatever the header says. */
  kinds: CellKind[];
}

const SECONDS_PER_DAY = 86_400;
const MS_PER_DAY = 86_400_000;
/** A clock that goes back by more than this has passed midnight; a logger's own jitter is far smaller. */
const MIDNIGHT_JUMP_S = SECONDS_PER_DAY / 2;

/** Days from 1970-01-01 to a proleptic Gregorian date (Hinnant's days_from_civil) [CALC]. */
function daysFromCivil(year: number, month: number, day: number): number {
  const y = month <= 2 ? year - 1 : year;
  const era = Math.floor(y / 400);
  const yoe = y - era * 400;
  const doy = Math.floor((153 * (month + (month > 2 ? -3 : 9)) + 2) / 5) + day - 1;
  const doe = yoe * 365 + Math.floor(yoe / 4) - Math.floor(yoe / 100) + doy;
  return era * 146_097 + doe - 719_468;
}

const isDigit = (b: number | undefined): b is number => b !== undefined && b >= ZERO && b <= NINE;

/** Parser state for one field that the slow path read: where it ended, what kind of cell it was. */
let slowEnd = 0;
let slowKind: 0 | 1 | 2 = 0;

/**
 * Reads `count` digits at `pos` as an integer, or -1 when they are not all there.
 */
function digitsAt(bytes: Uint8Array, pos: number, count: number): number {
  let value = 0;
  for (let i = 0; i < count; i++) {
    const b = bytes[pos + i];
    if (!isDigit(b)) return -1;
    value = value * 10 + (b - ZERO);
  }
  return value;
}

/**
 * An ISO 8601 extended date-time at `pos` (YYYY-MM-DD, then `T` or a space and hh:mm[:ss[.fff]], then `Z`, ±hh:mm,
 * ±hhmm or nothing) as milliseconds since 1970 UTC; NaN when it is not one. A stamp without a zone is read as UTC:
 * only differences between rows matter. Sets slowEnd to the byte after it.
 */
function parseDateTime(bytes: Uint8Array, pos: number, fractionComma: boolean): number {
  const year = digitsAt(bytes, pos, 4);
  const month = digitsAt(bytes, pos + 5, 2);
  const day = digitsAt(bytes, pos + 8, 2);
  if (year < 0 || bytes[pos + 4] !== MINUS || bytes[pos + 7] !== MINUS || month < 1 || month > 12)
    return Number.NaN;
  if (day < 1 || day > 31) return Number.NaN;
  let ms = daysFromCivil(year, month, day) * MS_PER_DAY;
  pos += 10;
  const sep = bytes[pos];
  if ((sep === 0x54 || sep === 0x74 || sep === SPACE) && isDigit(bytes[pos + 1])) {
    const hour = digitsAt(bytes, pos + 1, 2);
    const minute = digitsAt(bytes, pos + 4, 2);
    if (hour < 0 || hour > 24 || bytes[pos + 3] !== COLON || minute < 0 || minute > 59)
      return Number.NaN;
    ms += (hour * 60 + minute) * 60_000;
    pos += 6;
    if (bytes[pos] === COLON) {
      const second = digitsAt(bytes, pos + 1, 2);
      if (second < 0 || second > 60) return Number.NaN;
      ms += second * 1000;
      pos += 3;
      const mark = bytes[pos];
      if ((mark === DOT || (fractionComma && mark === COMMA)) && isDigit(bytes[pos + 1])) {
        let scale = 100;
        for (pos++; isDigit(bytes[pos]); pos++) {
          ms += ((bytes[pos] as number) - ZERO) * scale;
          scale /= 10;
        }
      }
    }
    const zone = bytes[pos];
    if (zone === 0x5a || zone === 0x7a) pos++;
    else if (zone === PLUS || zone === MINUS) {
      const hours = digitsAt(bytes, pos + 1, 2);
      if (hours < 0) return Number.NaN;
      pos += 3;
      if (bytes[pos] === COLON) pos++;
      const minutes = isDigit(bytes[pos]) ? digitsAt(bytes, pos, 2) : 0;
      if (minutes < 0) return Number.NaN;
      if (isDigit(bytes[pos])) pos += 2;
      // A zone ahead of UTC means the same instant is earlier in UTC.
      ms -= (zone === PLUS ? 1 : -1) * (hours * 60 + minutes) * 60_000;
    }
  }
  slowEnd = pos;
  return ms;
}

/**
 * Any cell the fast path could not finish: padding and quotes, exponents, clock times, ISO date-times, text.
 * Returns the value (NaN for a blank or text cell) and sets slowEnd and slowKind (1 clock, 2 date-time in ms).
 */
function parseCellSlow(
  bytes: Uint8Array,
  start: number,
  end: number,
  delimiter: number,
  decimal: number,
): number {
  let pos = start;
  slowKind = 0;
  while (pos < end && (bytes[pos] === SPACE || bytes[pos] === QUOTE)) pos++;
  let value = Number.NaN;
  let b = bytes[pos] as number;
  if (isDigit(b) && bytes[pos + 4] === MINUS && digitsAt(bytes, pos, 4) >= 0) {
    value = parseDateTime(bytes, pos, delimiter !== COMMA);
    if (!Number.isNaN(value)) {
      slowKind = 2;
      pos = slowEnd;
    }
  } else {
    let negative = false;
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
    while (pos < end) {
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
        slowKind = 1;
      } else if ((b === 0x65 || b === 0x45) && digits > 0) {
        pos++;
        let expNegative = false;
        if (bytes[pos] === MINUS || bytes[pos] === PLUS) {
          expNegative = bytes[pos] === MINUS;
          pos++;
        }
        while (pos < end && isDigit(bytes[pos])) {
          exponent = exponent * 10 + ((bytes[pos] as number) - ZERO);
          pos++;
        }
        if (expNegative) exponent = -exponent;
        break;
      } else break;
      pos++;
    }
    if (digits > 0) {
      value =
        fractionDigits < POW10.length
          ? mantissa / (POW10[fractionDigits] as number)
          : mantissa / 10 ** fractionDigits;
      value += clock;
      if (exponent > 0) value *= 10 ** exponent;
      else if (exponent < 0) value /= 10 ** -exponent;
      if (negative) value = -value;
    }
  }
  while (pos < end && (bytes[pos] === SPACE || bytes[pos] === QUOTE)) pos++;
  b = bytes[pos] as number;
  if (pos < end && b !== delimiter && b !== LF && b !== CR) {
    value = Number.NaN;
    slowKind = 0;
    pos = skipField(bytes, pos, end, delimiter);
  }
  slowEnd = pos;
  return value;
}

/** Moves past a field the parser does not want (quoted delimiters included); stops at its delimiter or line end. */
function skipField(bytes: Uint8Array, pos: number, end: number, delimiter: number): number {
  let quoted = false;
  while (pos < end) {
    const b = bytes[pos] as number;
    if (b === QUOTE) quoted = !quoted;
    else if (!quoted && (b === delimiter || b === LF || b === CR)) break;
    pos++;
  }
  return pos;
}

const concat = (a: Uint8Array, b: Uint8Array) => {
  const joined = new Uint8Array(a.length + b.length);
  joined.set(a);
  joined.set(b, a.length);
  return joined;
};

function lastLineEnd(bytes: Uint8Array, from: number): number {
  for (let i = bytes.length - 1; i >= from; i--) if (bytes[i] === LF || bytes[i] === CR) return i;
  return -1;
}

/**
 * Parses the requested columns straight from the bytes, a piece at a time: one pass, no strings per row, memory
 * bounded by the columns themselves. Blank or non-numeric cells become NaN; rows whose requested cells are all
 * blank (footers, comments) are skipped. Clock times are seconds of the day (passing midnight adds a day);
 * ISO 8601 date-times are seconds from the column's first one.
 */
export function parseCsvColumns(
  input: CsvInput,
  layout: CsvLayout,
  requests: readonly ColumnRequest[],
  onProgress?: (fraction: number) => void,
): ParsedColumns {
  const total = input instanceof Uint8Array ? input.length : input.byteLength;
  const delimiter = layout.delimiter;
  const decimal = layout.decimalComma ? COMMA : DOT;
  const width = Math.max(layout.headers.length, ...requests.map((r) => r.column + 1));
  const slot = new Int32Array(width + 1).fill(-1);
  requests.forEach((r, i) => (slot[r.column] = i));
  const wanted = requests.length;

  let capacity =
    Math.ceil(((total - layout.dataStart) / Math.max(1, layout.bytesPerRow)) * 1.05) + 16;
  const columns: ColumnArray[] = requests.map((r) =>
    r.float64 ? new Float64Array(capacity) : new Float32Array(capacity),
  );
  // Per column: the first date-time (ms), the days a clock has wrapped, the last clock reading, cells by kind.
  const dateBase = new Float64Array(wanted).fill(Number.NaN);
  const clockDays = new Float64Array(wanted);
  const lastClock = new Float64Array(wanted).fill(Number.NaN);
  const clockCells = new Float64Array(wanted);
  const dateCells = new Float64Array(wanted);
  let rows = 0;

  /** Parses whole lines in bytes[start, end); the byte before `end` ends a line, so scans stop there. */
  const parseLines = (bytes: Uint8Array, start: number, end: number) => {
    // Locals, not the closure's variables: this loop runs once per row of a million-row log.
    let row = rows;
    let size = capacity;
    let pos = start;
    while (pos < end) {
      let b = bytes[pos] as number;
      if (b === LF || b === CR) {
        pos++;
        continue;
      }
      if (row === size) {
        size = Math.ceil(size * 1.5) + 16;
        for (let i = 0; i < wanted; i++) columns[i] = grow(columns[i] as ColumnArray, size);
      }
      let col = 0;
      let numericCells = 0;
      for (;;) {
        const target = col < width ? (slot[col] as number) : -1;
        if (target < 0) {
          pos = skipField(bytes, pos, end, delimiter);
        } else {
          // Fast path: digits, an optional fraction, then the field's end. Anything else goes the slow way.
          const fieldStart = pos;
          b = bytes[pos] as number;
          let negative = false;
          if (b === MINUS) {
            negative = true;
            b = bytes[++pos] as number;
          }
          let mantissa = 0;
          let digits = 0;
          while (b >= ZERO && b <= NINE) {
            mantissa = mantissa * 10 + (b - ZERO);
            digits++;
            b = bytes[++pos] as number;
          }
          let fractionDigits = 0;
          if (b === decimal) {
            b = bytes[++pos] as number;
            while (b >= ZERO && b <= NINE) {
              mantissa = mantissa * 10 + (b - ZERO);
              fractionDigits++;
              b = bytes[++pos] as number;
            }
          }
          let value: number;
          if (
            (b === delimiter || b === LF || b === CR) &&
            digits + fractionDigits > 0 &&
            fractionDigits < POW10.length
          ) {
            value = mantissa / (POW10[fractionDigits] as number);
            if (negative) value = -value;
          } else if (b === delimiter || b === LF || b === CR) {
            if (digits + fractionDigits === 0) value = Number.NaN;
            else {
              value = parseCellSlow(bytes, fieldStart, end, delimiter, decimal);
              pos = slowEnd;
            }
          } else {
            value = parseCellSlow(bytes, fieldStart, end, delimiter, decimal);
            pos = slowEnd;
            if (slowKind === 2) {
              // Seconds from the column's first stamp, from whole milliseconds, so steps stay exact.
              if (Number.isNaN(dateBase[target] as number)) dateBase[target] = value;
              value = (value - (dateBase[target] as number)) / 1000;
              dateCells[target] = (dateCells[target] as number) + 1;
            } else if (slowKind === 1) {
              const last = lastClock[target] as number;
              if (value < last - MIDNIGHT_JUMP_S)
                clockDays[target] = (clockDays[target] as number) + 1;
              lastClock[target] = value;
              value += (clockDays[target] as number) * SECONDS_PER_DAY;
              clockCells[target] = (clockCells[target] as number) + 1;
            }
          }
          if (!Number.isNaN(value)) numericCells++;
          (columns[target] as ColumnArray)[row] = value;
        }
        if (pos < end && bytes[pos] === delimiter) {
          pos++;
          col++;
          continue;
        }
        break;
      }
      for (let c = col + 1; c < width; c++) {
        const target = slot[c] as number;
        if (target >= 0) (columns[target] as ColumnArray)[row] = Number.NaN;
      }
      if (numericCells > 0 || wanted === 0) row++;
    }
    rows = row;
    capacity = size;
  };

  const step = Math.max(1 << 20, Math.floor(total / 100));
  let nextReport = layout.dataStart + step;
  let offset = 0;
  let carry: Uint8Array = new Uint8Array(0);
  const pieces = input instanceof Uint8Array ? [input] : input.chunks();
  for (const piece of pieces) {
    const from = Math.max(0, layout.dataStart - offset);
    offset += piece.length;
    if (from >= piece.length) continue;
    const last = lastLineEnd(piece, from);
    if (last < 0) {
      carry = concat(carry, piece.subarray(from));
      continue;
    }
    let start = from;
    if (carry.length > 0) {
      // The line cut at the end of the previous piece, finished by the start of this one.
      let first = from;
      while (piece[first] !== LF && piece[first] !== CR) first++;
      const line = concat(carry, piece.subarray(from, first + 1));
      parseLines(line, 0, line.length);
      start = first + 1;
    }
    parseLines(piece, start, last + 1);
    carry = piece.slice(last + 1);
    if (offset >= nextReport && onProgress) {
      onProgress(offset / total);
      nextReport = offset + step;
    }
  }
  if (carry.length > 0) {
    const line = concat(carry, new Uint8Array([LF]));
    parseLines(line, 0, line.length);
  }
  onProgress?.(1);
  // Copy only when the size estimate was far off: the copy briefly doubles the memory the columns take.
  const trimmed = columns.map((c) =>
    c.length > rows * 1.5 + 64 ? c.slice(0, rows) : c.subarray(0, rows),
  );
  // A column is time stamps when most of its rows are.
  const kinds = requests.map((_, i): CellKind =>
    (dateCells[i] as number) * 2 > rows
      ? 'date_time'
      : (clockCells[i] as number) * 2 > rows
        ? 'clock'
        : 'number',
  );
  return { rows, columns: trimmed, kinds };
}
