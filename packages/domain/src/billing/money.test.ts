import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { currencyMinorDigits, formatMoney, minorToDecimalString, parseMoneyInput } from './money';

describe('currencyMinorDigits', () => {
  it('follows ISO 4217 minor units', () => {
    // ISO 4217 list one: USD 2, EUR 2, JPY 0, KWD 3 [STD]
    expect(currencyMinorDigits('usd')).toBe(2);
    expect(currencyMinorDigits('EUR')).toBe(2);
    expect(currencyMinorDigits('JPY')).toBe(0);
    expect(currencyMinorDigits('KWD')).toBe(3);
  });

  it('refuses unknown codes', () => {
    expect(() => currencyMinorDigits('XYZ')).toThrow(
      expect.objectContaining({ code: 'validation' }),
    );
  });
});

describe('formatMoney', () => {
  it('formats minor units with the currency digits', () => {
    // oracle: Intl.NumberFormat on the decimal amount (ECMA-402 with CLDR data) [STD]
    expect(formatMoney(1250, 'USD')).toBe('$12.50');
    expect(formatMoney(1250, 'JPY')).toBe('¥1,250');
    expect(formatMoney(1250, 'KWD')).toBe(
      new Intl.NumberFormat('en-US', { style: 'currency', currency: 'KWD' }).format(1.25),
    );
    expect(formatMoney(123456, 'EUR', 'de-DE')).toBe(
      new Intl.NumberFormat('de-DE', { style: 'currency', currency: 'EUR' }).format(1234.56),
    );
    expect(formatMoney(-5, 'USD')).toBe('-$0.05');
  });

  it('keeps every cent of amounts beyond float precision of their decimal form', () => {
    expect(formatMoney(Number.MAX_SAFE_INTEGER, 'USD')).toBe('$90,071,992,547,409.91');
  });

  it('refuses fractional minor units', () => {
    expect(() => formatMoney(12.5, 'USD')).toThrow(expect.objectContaining({ code: 'validation' }));
  });
});

describe('parseMoneyInput', () => {
  it.each([
    ['12.50', 'USD', 1250],
    ['12.5', 'USD', 1250],
    ['12', 'USD', 1200],
    [' 1,250.00 ', 'USD', 125000],
    ['0.07', 'EUR', 7],
    ['1250', 'JPY', 1250],
    ['1.250', 'KWD', 1250],
  ])('%j %s → %i', (text, currency, minor) => {
    expect(parseMoneyInput(text, currency)).toBe(minor);
  });

  it.each([
    ['', 'USD', /Enter an amount/],
    ['12.505', 'USD', /at most 2 decimal places/],
    ['12.5', 'JPY', /no decimal places/],
    ['-3', 'USD', /negative/],
    ['12,50', 'USD', /dot for decimals/],
    ['$12', 'USD', /not an amount/],
    ['1e3', 'USD', /not an amount/],
    ['99999999999999999', 'USD', /too large/],
  ])('refuses %j in %s', (text, currency, message) => {
    expect(() => parseMoneyInput(text, currency)).toThrow(
      expect.objectContaining({ code: 'validation', message: expect.stringMatching(message) }),
    );
  });

  it('round-trips through the decimal string (property)', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 0, max: Number.MAX_SAFE_INTEGER }),
        fc.constantFrom('USD', 'JPY', 'KWD'),
        (minor, currency) => {
          expect(parseMoneyInput(minorToDecimalString(minor, currency), currency)).toBe(minor);
        },
      ),
    );
  });
});
