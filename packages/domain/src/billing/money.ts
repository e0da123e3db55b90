import { z } from 'zod';
import { DomainError } from '../errors';

/**
 * Money is stored and computed as integer minor units (cents, yen, fils) with its ISO 4217 currency; floats never
 * hold an amount, so sums and comparisons are exact.
 */
export const moneyMinorSchema = z
  .number()
  .int('Amounts are whole minor units (e.g. cents).')
  .min(0, 'An amount cannot be negative.')
  .max(Number.MAX_SAFE_INTEGER, 'That amount is too large.');

const SUPPORTED_CURRENCIES = new Set(Intl.supportedValuesOf('currency'));

/** Upper-cases and checks an ISO 4217 code against the runtime's currency list. */
export function normalizeCurrency(currency: string): string {
  const code = currency.trim().toUpperCase();
  if (!SUPPORTED_CURRENCIES.has(code)) {
    throw new DomainError(
      'validation',
      `"${currency}" is not an ISO 4217 currency code such as USD or EUR.`,
    );
  }
  return code;
}

/** Digits after the decimal point for the currency (USD 2, JPY 0, KWD 3), from the runtime's CLDR data. */
export function currencyMinorDigits(currency: string): number {
  const code = normalizeCurrency(currency);
  return (
    new Intl.NumberFormat('en', { style: 'currency', currency: code }).resolvedOptions()
      .maximumFractionDigits ?? 2
  );
}

function assertMinor(minor: number): void {
  if (!Number.isSafeInteger(minor)) {
    throw new DomainError(
      'validation',
      `A money amount must be a whole number of minor units, got ${minor}.`,
    );
  }
}

/** "1250" minor units of USD → "12.50": string arithmetic, so no float ever rounds the amount. */
export function minorToDecimalString(minor: number, currency: string): string {
  assertMinor(minor);
  const digits = currencyMinorDigits(currency);
  const sign = minor < 0 ? '-' : '';
  const abs = String(Math.abs(minor)).padStart(digits + 1, '0');
  if (digits === 0) return `${sign}${abs}`;
  return `${sign}${abs.slice(0, -digits)}.${abs.slice(-digits)}`;
}

/** Formats minor units for display, e.g. formatMoney(1250, 'USD') → "$12.50", formatMoney(1250, 'JPY') → "¥1,250". */
export function formatMoney(minor: number, currency: string, locale = 'en-US'): string {
  const code = normalizeCurrency(currency);
  const decimal = minorToDecimalString(minor, code) as Intl.StringNumericLiteral;
  return new Intl.NumberFormat(locale, { style: 'currency', currency: code }).format(decimal);
}

const MONEY_INPUT = /^(\d{1,3}(?:,\d{3})+|\d+)(?:\.(\d+))?$/;

/**
 * Parses what a user types into a price field: "12.50", "1,250.00", "12". The dot is the decimal separator and
 * commas may only group thousands, so "12,50" is refused rather than guessed.
 */
export function parseMoneyInput(text: string, currency: string): number {
  const code = normalizeCurrency(currency);
  const digits = currencyMinorDigits(code);
  const value = text.trim();
  if (value === '') throw new DomainError('validation', 'Enter an amount.');
  if (value.startsWith('-')) throw new DomainError('validation', 'An amount cannot be negative.');
  const match = MONEY_INPUT.exec(value);
  const whole = match?.[1];
  if (whole === undefined) {
    throw new DomainError(
      'validation',
      `"${text}" is not an amount: use digits with a dot for decimals, e.g. ${digits === 0 ? '1250' : `12.${'5'.padEnd(digits, '0')}`}.`,
    );
  }
  const fraction = match?.[2] ?? '';
  if (fraction.length > digits) {
    throw new DomainError(
      'validation',
      digits === 0
        ? `${code} has no decimal places.`
        : `${code} has at most ${digits} decimal places.`,
    );
  }
  const minor = Number(whole.replaceAll(',', '') + fraction.padEnd(digits, '0'));
  if (!Number.isSafeInteger(minor))
    throw new DomainError('validation', 'That amount is too large.');
  return minor;
}
