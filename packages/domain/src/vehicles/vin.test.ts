import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  NOT_ENCODED_WARNING,
  checkVin,
  vinCheckDigit,
  vinModelYear,
  vinNeedsConfirmation,
  vinRegion,
} from './vin';

describe('vinCheckDigit', () => {
  it.each([
    // 49 CFR 565.15(c) Table V worked example (weights of Table IV): Σ 411 → 4 [STD]
    ['1G4AH59H?5G118341', '4'],
    // widely reproduced example [3P]
    ['1M8GDM9A?KP042788', 'X'],
    // NHTSA manufacturer guidance example [3P]
    ['1J9RP1A3?A1644345', '6'],
  ])('%s → %s', (template, digit) => {
    expect(vinCheckDigit(template.replace('?', '0'))).toBe(digit);
    expect(checkVin(template.replace('?', digit))).toMatchObject({
      wellFormed: true,
      checkDigitOk: true,
      errors: [],
      warnings: [],
    });
  });

  it('warns, but does not refuse, 1M8GDM9A1KP042788 (check digit should be X) [3P]', () => {
    const result = checkVin('1M8GDM9A1KP042788');
    expect(result).toMatchObject({
      wellFormed: true,
      checkDigitOk: false,
      expectedCheckDigit: 'X',
      errors: [],
    });
    expect(result.warnings).toHaveLength(1);
  });

  it('catches every single substitution that changes a transliterated value (property)', () => {
    // Σ changes by w·Δ with w in 2..10 and Δ in ±1..9, never a multiple of 11 (11 is prime) [CALC]
    const VALUES = '0123456789ABCDEFGHJKLMNPRSTUVWXYZ';
    // 49 CFR 565.15(c) Table III, in value order [STD]
    const valueOf = (c: string) =>
      /\d/.test(c)
        ? Number(c)
        : ['AJ', 'BKS', 'CLT', 'DMU', 'ENV', 'FW', 'GPX', 'HY', 'RZ'].findIndex((g) =>
            g.includes(c),
          ) + 1;
    const base = '1G4AH59H45G118341';
    fc.assert(
      fc.property(
        fc.integer({ min: 0, max: 16 }).filter((i) => i !== 8),
        fc.constantFrom(...VALUES),
        (i, replacement) => {
          fc.pre(valueOf(replacement) !== valueOf(base.charAt(i)));
          const mutated = base.slice(0, i) + replacement + base.slice(i + 1);
          expect(vinCheckDigit(mutated)).not.toBe('4');
        },
      ),
    );
  });
});

describe('vinModelYear', () => {
  it('1M8GDM9AXKP042788 → 1989 (position 7 numeric, K) [STD 49 CFR 565.15(d)]', () => {
    expect(vinModelYear('1M8GDM9AXKP042788')).toBe(1989);
    expect(checkVin('1M8GDM9AXKP042788').modelYear).toBe(1989);
  });

  it('a letter at position 7 moves the same code 30 years on [STD 49 CFR 565.15(d)]', () => {
    expect(vinModelYear('1M8GDMAAXKP042788')).toBe(2019);
  });

  it('1G4AH59H45G118341 → 2005', () => {
    // position 10 "5", position 7 numeric: 1980 + index of "5" (25) [STD 49 CFR 565.15(d)]
    expect(vinModelYear('1G4AH59H45G118341')).toBe(2005);
  });
});

describe('checkVin refuses malformed input', () => {
  it.each([
    ['too short', '1G4AH59H45G11834'],
    ['I', '1G4AH59H45G11834I'],
    ['O', '1G4AH59H45G1183O1'],
    ['Q', 'QG4AH59H45G118341'],
    ['punctuation', '1G4AH59H45G-18341'],
    ['check position not a digit', '1G4AH59HA5G118341'],
    ['year code U', '1G4AH59H4UG118341'],
  ])('%s', (_label, vin) => {
    const result = checkVin(vin);
    expect(result.wellFormed).toBe(false);
    expect(result.errors.length).toBeGreaterThan(0);
    expect(result.checkDigitOk).toBe(false);
  });

  it('normalises case and spaces', () => {
    expect(checkVin(' 1g4ah59h45g 118341 ').vin).toBe('1G4AH59H45G118341');
  });
});

describe('VINs from outside North America (ISO 3779 / ISO 3780)', () => {
  it.each([
    // ISO 3780 regions by the WMI's first character, as widely reproduced; not checked against the standard's text [MEM]
    ['1', 'north_america'],
    ['2', 'north_america'],
    ['5', 'north_america'],
    ['A', 'africa'],
    ['H', 'africa'],
    ['J', 'asia'],
    ['R', 'asia'],
    ['S', 'europe'],
    ['W', 'europe'],
    ['Z', 'europe'],
    ['6', 'oceania'],
    ['7', 'oceania'],
    ['8', 'south_america'],
    ['9', 'south_america'],
    ['0', 'unassigned'],
  ])('a WMI starting with %s is from %s', (first, region) => {
    expect(vinRegion(`${first}XXXXXXXXXXXXXXXX`)).toBe(region);
  });

  // Synthetic VIN built to the ISO 3779 layout, not a real vehicle [CALC]: WMI from region W (Europe), filler ZZZ in
  // positions 4–6 and Z in position 9 where a North American VIN has its check digit.
  const EUROPEAN = 'WVWZZZ1KZ6W000001';

  it('accepts a European VIN with fillers, warns, and leaves the model year to the user', () => {
    const result = checkVin(EUROPEAN);
    expect(result).toMatchObject({
      region: 'europe',
      northAmerican: false,
      wellFormed: true,
      modelYear: null,
      errors: [],
      warnings: [NOT_ENCODED_WARNING],
    });
    expect(vinNeedsConfirmation(result)).toBe(false);
  });

  it('refuses the same characters behind a North American WMI (position 9 is no check digit) [STD 49 CFR 565.15(c)]', () => {
    const result = checkVin(`1${EUROPEAN.slice(1)}`);
    expect(result.wellFormed).toBe(false);
    expect(result.errors.join(' ')).toMatch(/Position 9 is the check digit/);
  });

  it('does not decode position 10 outside North America: "U" is no year code but is accepted [CALC]', () => {
    const result = checkVin('WVWZZZ1KZUW000001');
    expect(result).toMatchObject({ wellFormed: true, modelYear: null });
  });

  it('still applies the ISO 3779 alphabet everywhere: no I, O or Q [MEM]', () => {
    expect(checkVin('WVWZZZ1KZ6W00000O').wellFormed).toBe(false);
    expect(checkVin('WVWZZZ1KZ6W0000').wellFormed).toBe(false);
  });

  it('JH2RC360?MM101581 → 5, the sample of the older 49 CFR 565 text; its Asian WMI makes it a note, not a rule [3P]', () => {
    // sample calculation of 49 CFR 565 before the 2008 rewrite, as reproduced by vsource.org and myvindecoder.com [3P]
    expect(vinCheckDigit('JH2RC3600MM101581')).toBe('5');
    const result = checkVin('JH2RC3605MM101581');
    expect(result).toMatchObject({
      region: 'asia',
      checkDigitOk: true,
      modelYear: null,
      warnings: [NOT_ENCODED_WARNING],
    });
    expect(vinNeedsConfirmation(checkVin('JH2RC3601MM101581'))).toBe(false);
  });

  it('a North American VIN with a wrong check digit still needs confirming [3P]', () => {
    expect(vinNeedsConfirmation(checkVin('1M8GDM9A1KP042788'))).toBe(true);
    expect(vinNeedsConfirmation(checkVin('1M8GDM9AXKP042788'))).toBe(false);
  });
});
