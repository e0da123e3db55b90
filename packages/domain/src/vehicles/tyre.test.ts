import { describe, expect, it } from 'vitest';
import { evaluate } from 'mathjs';
import { parseTyreSize } from './tyre';

describe('parseTyreSize', () => {
  it('derives 245/40R20 geometry', () => {
    // REFERENCES.md, ISO 4000-1 / ETRTO designation: 245/40R20 → D 704.0 mm, C 2211.7 mm [MEM]
    const tyre = parseTyreSize('245/40R20');
    expect(tyre).toMatchObject({
      code: '245/40R20',
      widthMm: 245,
      aspectRatio: 40,
      rimIn: 20,
      sidewallMm: 98,
    });
    expect(tyre.diameterMm).toBeCloseTo(704.0, 1);
    expect(tyre.circumferenceMm).toBeCloseTo(2211.7, 1);
  });

  it('agrees with mathjs unit conversion for the rim inches', () => {
    // oracle: mathjs converts 20 inch to mm independently (inch = 25.4 mm exactly) [STD]
    const rimMm = evaluate('20 inch to mm').toNumber('mm') as number;
    expect(parseTyreSize('245/40R20').diameterMm).toBeCloseTo(rimMm + 2 * 98, 9);
  });

  it.each(['245/40 R20', 'P245/40ZR20 95Y', 'p245/40zr20', '245/40R20 95Y XL'])(
    'reads %s like 245/40R20',
    (code) => {
      expect(parseTyreSize(code).code).toBe('245/40R20');
    },
  );

  it('keeps the half-inch rim of 225/45R17.5', () => {
    expect(parseTyreSize('225/45R17.5').rimIn).toBe(17.5);
  });

  it.each(['', '245/40', '31x10.50R15', '245-40-20', '999/40R20', '245/40R20 banana'])(
    'refuses %j',
    (code) => {
      expect(() => parseTyreSize(code)).toThrow(expect.objectContaining({ code: 'validation' }));
    },
  );
});
