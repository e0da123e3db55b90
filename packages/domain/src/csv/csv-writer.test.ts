import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { csvCell, toCsv } from './csv-writer';

/** Independent RFC 4180 reader for the round-trip check: a small state machine over characters. */
function parseRfc4180(text: string): string[][] {
  const records: string[][] = [];
  let record: string[] = [];
  let cell = '';
  let quoted = false;
  for (let i = 0; i < text.length; i += 1) {
    const c = text[i];
    if (quoted) {
      if (c === '"' && text[i + 1] === '"') {
        cell += '"';
        i += 1;
      } else if (c === '"') quoted = false;
      else cell += c;
    } else if (c === '"') quoted = true;
    else if (c === ',') {
      record.push(cell);
      cell = '';
    } else if (c === '\r' && text[i + 1] === '\n') {
      record.push(cell);
      records.push(record);
      record = [];
      cell = '';
      i += 1;
    } else cell += c;
  }
  return records;
}

describe('csvCell', () => {
  it.each([
    // RFC 4180 §2.6–2.7: fields with commas, quotes or line breaks are quoted, inner quotes doubled [STD]
    ['plain', 'plain'],
    ['a,b', '"a,b"'],
    ['say "hi"', '"say ""hi"""'],
    ['two\nlines', '"two\nlines"'],
    ['', ''],
  ])('quotes %j as %j', (value, cell) => {
    expect(csvCell(value)).toBe(cell);
  });

  it.each([
    // OWASP CSV Injection: cells beginning with = + - @ tab or CR are prefixed with a single quote [3P]
    ['=1+1', "'=1+1"],
    ['+1', "'+1"],
    ['-2+3', "'-2+3"],
    ['@SUM(A1:A2)', "'@SUM(A1:A2)"],
    ['\tcmd', "'\tcmd"],
    ['\rcmd', `"'\rcmd"`],
    ['=HYPERLINK("http://x","y")', `"'=HYPERLINK(""http://x"",""y"")"`],
    ['a=b', 'a=b'],
  ])('neutralises %j as %j', (value, cell) => {
    expect(csvCell(value)).toBe(cell);
  });

  it('leaves numbers passed as numbers alone, negative ones too', () => {
    expect(csvCell(-5)).toBe('-5');
    expect(csvCell(12.5)).toBe('12.5');
    expect(csvCell('-5')).toBe("'-5");
  });

  it('writes null, undefined and non-finite numbers as empty cells', () => {
    expect([null, undefined, Number.NaN, Number.POSITIVE_INFINITY].map(csvCell)).toEqual([
      '',
      '',
      '',
      '',
    ]);
  });
});

describe('toCsv', () => {
  it('ends every line with CRLF', () => {
    expect(
      toCsv(
        ['job', 'amount'],
        [
          ['Rev 1', 1250],
          ['x,y', null],
        ],
      ),
    ).toBe('job,amount\r\nRev 1,1250\r\n"x,y",\r\n');
  });

  it('refuses a row whose width differs from the header', () => {
    expect(() => toCsv(['a', 'b'], [['1']])).toThrow(
      expect.objectContaining({ code: 'validation' }),
    );
  });

  it('round-trips any text that is not a formula (property)', () => {
    const safeText = fc.string({ unit: 'grapheme' }).filter((s) => !/^[=+\-@\t\r]/.test(s));
    fc.assert(
      fc.property(fc.array(fc.tuple(safeText, safeText), { maxLength: 5 }), (rows) => {
        const parsed = parseRfc4180(toCsv(['a', 'b'], rows));
        expect(parsed).toEqual([['a', 'b'], ...rows]);
      }),
    );
  });
});
