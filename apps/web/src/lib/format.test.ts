import { describe, expect, it } from 'vitest';
import { formatSigned } from './format';

describe('formatSigned', () => {
  it('never prints a negative zero', () => {
    // -0.04 rounds to 0.0 at one decimal [CALC]; (-0.04).toFixed(1) gives "-0.0", which is what this avoids.
    expect((-0.04).toFixed(1)).toBe('-0.0');
    expect(formatSigned(-0.04)).toBe('0.0');
    expect(formatSigned(-0)).toBe('0.0');
    expect(formatSigned(0.04)).toBe('0.0');
  });

  it('signs everything else, with the minus sign U+2212', () => {
    expect(formatSigned(1.46)).toBe('+1.5');
    expect(formatSigned(-0.05)).toBe('−0.1');
    expect(formatSigned(-12.345, 2)).toBe('−12.35');
    expect(formatSigned(Number.NaN)).toBe('—');
  });
});
