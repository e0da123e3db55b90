import { describe, expect, it } from 'vitest';
import { DomainError } from '../errors';
import { detectCsvLayout, parseCsvColumns } from './csv-reader';

const bytes = (text: string) => new TextEncoder().encode(text);
const parseAll = (text: string) => {
  const b = bytes(text);
  const layout = detectCsvLayout(b);
  const parsed = parseCsvColumns(
    b,
    layout,
    layout.headers.map((_, column) => ({ column, float64: true })),
  );
  return { layout, rows: parsed.rows, columns: parsed.columns.map((c) => Array.from(c)) };
};

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
});
