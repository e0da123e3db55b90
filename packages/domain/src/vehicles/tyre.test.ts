import { describe, expect, it } from 'vitest';
import { evaluate } from 'mathjs';
import { parseTyreSize, rollingCircumference } from './tyre';

describe('parseTyreSize', () => {
  it('derives 245/40R20 geometry', () => {
    // D = 20·25.4 + 2·245·0.40 = 704.0 mm, C = π·D = 2211.7 mm from the meaning of the ISO 4000-1 / ETRTO
    // designation (width/aspect R rim) [CALC]; REFERENCES.md "metric tyre size" gives the same
    const tyre = parseTyreSize('245/40R20');
    expect(tyre).toMatchObject({
      code: '245/40R20',
      widthMm: 245,
      aspectRatio: 40,
      rimIn: 20,
      commercial: false,
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

  it.each([
    '245/40 R20',
    'P245/40ZR20 95Y',
    'p245/40zr20',
    '245/40R20 95Y XL',
    '245/40ZR20 (95Y)',
    '245/40ZR20 (95Y) XL',
    '245/40R20 XL 95Y',
    '245/40R20 95 Y',
  ])('reads %s like 245/40R20', (code) => {
    expect(parseTyreSize(code).code).toBe('245/40R20');
  });

  it('keeps the half-inch rim of 225/45R17.5', () => {
    expect(parseTyreSize('225/45R17.5').rimIn).toBe(17.5);
  });

  it.each([
    ['215/65R16C', '215/65R16C'],
    ['215/65 R16 C', '215/65R16C'],
    ['215/65R16C 109/107T', '215/65R16C'],
    ['215/65R16C (109/107T)', '215/65R16C'],
  ])(
    'accepts the commercial tyre %s as %s with the dimensions of the plain size',
    (input, code) => {
      // "C" marks construction, not size: D = 16·25.4 + 2·215·0.65 = 685.9 mm [CALC]
      const tyre = parseTyreSize(input);
      expect(tyre).toMatchObject({
        code,
        commercial: true,
        widthMm: 215,
        aspectRatio: 65,
        rimIn: 16,
      });
      expect(tyre.diameterMm).toBeCloseTo(685.9, 6);
      expect(tyre.diameterMm).toBe(parseTyreSize('215/65R16').diameterMm);
    },
  );

  it.each(['225/45R17 94W', '225/45R17 (94W)', '225/45R17 94W XL', '225/45ZR17 (94W) XL'])(
    'reads the service description of %s and keeps 225/45R17',
    (code) => {
      // D = 17·25.4 + 2·225·0.45 = 634.3 mm [CALC]
      const tyre = parseTyreSize(code);
      expect(tyre.code).toBe('225/45R17');
      expect(tyre.diameterMm).toBeCloseTo(634.3, 6);
    },
  );

  it.each([
    '',
    '245/40',
    '31x10.50R15',
    '245-40-20',
    '999/40R20',
    '245/40R20 banana',
    '215/65R16CC',
    '225/45R17 (94W',
  ])('refuses %j', (code) => {
    expect(() => parseTyreSize(code)).toThrow(expect.objectContaining({ code: 'validation' }));
  });
});

describe('rollingCircumference', () => {
  it('uses the size when nothing was measured', () => {
    // C = π·704.0 = 2211.7 mm [CALC]
    const result = rollingCircumference({ tyreSize: '245/40R20', rollingCircumferenceMm: null });
    expect(result.source).toBe('tyre_size');
    expect(result.circumferenceMm).toBeCloseTo(2211.7, 1);
    expect(rollingCircumference({ tyreSize: '245/40R20' }).source).toBe('tyre_size');
  });

  it('prefers a measured rolling circumference', () => {
    expect(rollingCircumference({ tyreSize: '245/40R20', rollingCircumferenceMm: 2150 })).toEqual({
      circumferenceMm: 2150,
      source: 'measured',
    });
  });

  it('refuses a measurement that is no length', () => {
    expect(() =>
      rollingCircumference({ tyreSize: '245/40R20', rollingCircumferenceMm: 0 }),
    ).toThrow(expect.objectContaining({ code: 'validation' }));
  });
});
