import { describe, expect, it } from 'vitest';
import { DomainError } from '../errors';
import { detectCsvLayout, parseCsvColumns, type CsvSource } from './csv-reader';
import { readDatalog } from './series';
import { generateLog } from './testing';

const bytes = (text: string) => new TextEncoder().encode(text);
const parseAll = (text: string) => {
  const b = bytes(text);
  const layout = detectCsvLayout(b);
  const parsed = parseCsvColumns(
    b,
    layout,
    layout.headers.map((_, column) => ({ column, float64: true })),
  );
  return {
    layout,
    rows: parsed.rows,
    kinds: parsed.kinds,
    columns: parsed.columns.map((c) => Array.from(c)),
  };
};

/** The file in pieces of `size` bytes, each handed out in one reused buffer, as the file reader does. */
const inPieces = (b: Uint8Array, size: number, headBytes = 64): CsvSource => ({
  head: b.subarray(0, headBytes),
  byteLength: b.length,
  *chunks() {
    const piece = new Uint8Array(size);
    for (let at = 0; at < b.length; at += size) {
      const part = b.subarray(at, at + size);
      piece.set(part);
      yield piece.subarray(0, part.length);
    }
  },
});

/** Seconds between two ISO 8601 date-times by the JavaScript engine's own reading (ECMA-262 Date.parse). */
const between = (from: string, to: string) => (Date.parse(to) - Date.parse(from)) / 1000;

describe('detectCsvLayout and parseCsvColumns', () => {
  it('finds the header after a preamble and reads quoted headers, blanks and CRLF', () => {
    const { layout, rows, columns } = parseAll(
      'Logger export v2\r\nDate: 2024-05-01, 10:00\r\n\r\n"Time (s)","Engine RPM","Coolant Temp [°F]"\r\n0.0,800,100.5\r\n0.1,,101\r\n0.2,820,\r\n',
    );
    expect(layout.headers).toEqual(['Time (s)', 'Engine RPM', 'Coolant Temp [°F]']);
    expect(layout.delimiter).toBe(0x2c);
    expect(rows).toBe(3);
    expect(columns[0]).toEqual([0, 0.1, 0.2]);
    expect(columns[1]).toEqual([800, Number.NaN, 820]);
    expect(columns[2]).toEqual([100.5, 101, Number.NaN]);
  });

  it('reads semicolons with decimal commas and tabs', () => {
    const semi = parseAll('"Zeit";"RPM";"Lambda"\n0,05;1500;0,998\n0,10;1520;-1,5e-1\n');
    expect(semi.layout).toMatchObject({ delimiter: 0x3b, decimalComma: true });
    expect(semi.columns).toEqual([
      [0.05, 0.1],
      [1500, 1520],
      [0.998, -0.15],
    ]);
    const tab = parseAll('Time\tRPM\tMAP\n1.5\t900\t35.5\n');
    expect(tab.layout.delimiter).toBe(0x09);
    expect(tab.columns).toEqual([[1.5], [900], [35.5]]);
  });

  it('merges a units row into the headers and reads clock times as seconds', () => {
    const { layout, columns } = parseAll(
      'Time,Engine Speed,Speed\nhh:mm:ss,rpm,mph\n10:00:00.5,900,0\n10:00:01.0,950,1.5\n',
    );
    expect(layout.headers).toEqual(['Time (hh:mm:ss)', 'Engine Speed (rpm)', 'Speed (mph)']);
    expect(columns[0]).toEqual([36000.5, 36001]); // [CALC] 10 h = 36000 s
  });

  it('skips footer rows and turns text cells into NaN', () => {
    const { rows, columns } = parseAll('Time,RPM\n0,800\n1,N/A\nEnd of log\n');
    expect(rows).toBe(2);
    expect(columns[1]).toEqual([800, Number.NaN]);
  });

  it('decodes Windows-1252 headers', () => {
    const b = new Uint8Array([...bytes('Time,Coolant ('), 0xb0, ...bytes('F)\n0,180\n')]);
    expect(detectCsvLayout(b).headers).toEqual(['Time', 'Coolant (°F)']);
  });

  it.each([
    ['an empty file', '', /empty/],
    ['a header only', 'Time,RPM,MAP\n', /header row but no data/],
    ['numbers without a header', '1,2,3\n4,5,6\n', /No header row/],
  ])('rejects %s with a plain invalid_datalog error', (_, text, message) => {
    expect(() => detectCsvLayout(bytes(text))).toThrow(message);
    try {
      detectCsvLayout(bytes(text));
    } catch (error) {
      expect(error).toBeInstanceOf(DomainError);
      expect((error as DomainError).code).toBe('invalid_datalog');
    }
  });

  it('rejects binary data', () => {
    const binary = new Uint8Array(4096).map((_, i) => (i * 37) % 256);
    expect(() => detectCsvLayout(binary)).toThrow(/binary/);
  });

  it('grows its arrays when the row estimate is short', () => {
    const head = 'Time,RPM\n' + Array.from({ length: 30 }, (_, i) => `${i},1000`).join('\n') + '\n';
    const tail = Array.from({ length: 5000 }, (_, i) => `${i + 30},2`).join('\n');
    expect(parseAll(head + tail).rows).toBe(5030);
  });

  it('reads a file in pieces exactly as it reads it whole: lines, CRLF and a byte-order mark cut anywhere', () => {
    const text =
      '\uFEFFLogger export\r\n"Time (s)",RPM,"Coolant (°C)"\r\n' +
      Array.from({ length: 300 }, (_, i) => `${i / 10},${800 + i},${(i % 7) - 3}.5`).join('\r\n') +
      '\r\n0.5,,\r\n30.1,900,"1,5"';
    const whole = bytes(text);
    const layout = detectCsvLayout(whole);
    const requests = [0, 1, 2].map((column) => ({ column, float64: column === 0 }));
    const expected = parseCsvColumns(whole, layout, requests);
    for (const size of [1, 2, 3, 7, 64, 4096]) {
      const source = inPieces(whole, size, 512);
      expect(detectCsvLayout(source)).toEqual(layout);
      const parsed = parseCsvColumns(source, layout, requests);
      expect(parsed.rows, `pieces of ${size}`).toBe(expected.rows);
      expect(parsed.columns.map((c) => Array.from(c))).toEqual(
        expected.columns.map((c) => Array.from(c)),
      );
    }
    expect(expected.rows).toBe(302);
  });

  it('reads ISO 8601 date-times (T or space, fractions, Z, ±hh:mm or no zone) as seconds from the first', () => {
    // [STD] ISO 8601-1:2019 extended format; offsets checked against ECMA-262 Date.parse of the same instants.
    const stamps = [
      '2024-05-01T12:00:00Z',
      '2024-05-01T12:00:00.050Z',
      '2024-05-01 14:00:00.1+02:00',
      '2024-05-01T07:00:01.25-05:00',
      '2024-05-01T12:00:02,5+0000',
    ];
    const { columns, kinds } = parseAll(
      `Timestamp;RPM\n${stamps.map((s, i) => `${s};${900 + i}`).join('\n')}\n`,
    );
    const iso = [
      '2024-05-01T12:00:00Z',
      '2024-05-01T12:00:00.050Z',
      '2024-05-01T14:00:00.1+02:00',
      '2024-05-01T07:00:01.25-05:00',
      '2024-05-01T12:00:02.5Z',
    ];
    expect(columns[0]).toEqual(iso.map((s) => between(iso[0] as string, s)));
    expect(columns[0]).toEqual([0, 0.05, 0.1, 1.25, 2.5]); // [CALC] 14:00+02:00 = 12:00Z; 07:00-05:00 = 12:00Z
    expect(kinds).toEqual(['date_time', 'number']);
  });

  it('counts days, months and leap days between date-times without a zone', () => {
    // [STD] ISO 8601 calendar dates; 2024 is a leap year, so 28 Feb to 1 Mar is two days [CALC].
    const { columns } = parseAll(
      'Time,RPM\n2024-02-28 23:59:59.5,900\n2024-02-29 00:00:00.5,900\n2024-03-01 00:00:00.5,900\n2025-01-01 00:00:00,900\n',
    );
    expect(columns[0]).toEqual([
      0,
      1,
      86_401,
      between('2024-02-28T23:59:59.5Z', '2025-01-01T00:00:00Z'),
    ]);
    expect(columns[0]?.[2]).toBe(between('2024-02-28T23:59:59.5Z', '2024-03-01T00:00:00.5Z'));
  });

  it('carries clock times across midnight', () => {
    // [CALC] 23:59:59.9 is 86,399.9 s into the day; 00:00:00.1 the next day is 0.2 s later.
    const { columns, kinds } = parseAll(
      'Time,RPM\n23:59:59.900,900\n00:00:00.100,910\n00:00:01.100,920\n',
    );
    expect(columns[0]?.[0]).toBeCloseTo(86_399.9, 9);
    expect((columns[0]?.[1] as number) - (columns[0]?.[0] as number)).toBeCloseTo(0.2, 9);
    expect((columns[0]?.[2] as number) - (columns[0]?.[0] as number)).toBeCloseTo(1.2, 9);
    expect(kinds[0]).toBe('clock');
  });

  it('turns a malformed date-time into a blank, not a wrong time', () => {
    const { columns } = parseAll(
      'Time,RPM\n2024-05-01T12:00:00Z,900\n2024-13-01T12:00:00Z,900\n2024-05-01T12:00:01Zulu,900\n2024-05-01T12:00:02Z,900\n',
    );
    expect(columns[0]).toEqual([0, Number.NaN, Number.NaN, 2]);
  });

  it('gives a log stamped with ISO date-times a time axis in seconds (it held "no numbers" before)', () => {
    const generated = generateLog({ rateHz: 10, warmupS: 30, cruiseS: 10 }).text.split('\n');
    const start = Date.parse('2024-05-01T23:59:50Z');
    const stamped = generated
      .map((line, i) => {
        if (i === 0 || line === '') return line.replace(/^[^,]*/, 'Timestamp');
        const seconds = Number(line.slice(0, line.indexOf(',')));
        const at = new Date(start + Math.round(seconds * 1000)).toISOString();
        return `${at}${line.slice(line.indexOf(','))}`;
      })
      .join('\n');
    const series = readDatalog(bytes(stamped));
    const plain = readDatalog(bytes(generated.join('\n')));
    expect(series.units.time).toBe('s');
    expect(series.rows).toBe(plain.rows);
    for (let i = 0; i < series.rows; i += 97)
      expect(series.time[i]).toBeCloseTo(plain.time[i] as number, 3);
  });
});
