import { describe, expect, it } from 'vitest';
import { trimCorrectionPct } from './fuel-trim';

describe('trimCorrectionPct', () => {
  it('follows new = old·(1 + (STFT+LTFT)/100)', () => {
    // REFERENCES "fuel-trim correction" [CP]: STFT +4 %, LTFT +6 % → ×1.10, i.e. +10 % fuel.
    expect(1 + trimCorrectionPct(4 + 6) / 100).toBeCloseTo(1.1, 12);
    expect(trimCorrectionPct(-3)).toBe(-3); // ECU pulling fuel (rich) → take fuel out of the table
  });
});
