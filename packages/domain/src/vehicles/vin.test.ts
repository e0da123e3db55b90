import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { checkVin, vinCheckDigit, vinModelYear } from './vin';

describe('vinCheckDigit', () => {
  it.each([
    // 49 CFR 565 Table V worked example: Σ 411 → 4 [STD]
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
  it('1M8GDM9AXKP042788 → 1989 (position 7 numeric, K) [STD 49 CFR 565.15(b),(d)]', () => {
    expect(vinModelYear('1M8GDM9AXKP042788')).toBe(1989);
    expect(checkVin('1M8GDM9AXKP042788').modelYear).toBe(1989);
  });

  it('a letter at position 7 moves the same code 30 years on [STD 49 CFR 565.15(d)]', () => {
    expect(vinModelYear('1M8GDMAAXKP042788')).toBe(2019);
  });

  it('1G4AH59H45G118341 → 2005', () => {
    // position 10 "5", position 7 numeric: 1980 + index of "5" (25) [STD 49 CFR 565.15(b)]
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
