import { describe, expect, it } from 'vitest';
import { lambdaErrorPct } from './full-throttle';

describe('lambdaErrorPct', () => {
  it('is (λmeas/λcmd − 1)·100 and equals the exact fuel change that removes the error', () => {
    // [CALC] λ = air/(fuel·stoich): at fixed air, fuel ∝ 1/λ, so fuel_new/fuel_old = λmeas/λcmd.
    // Commanded 0.85, measured 0.90: 0.90/0.85 − 1 = 0.0588235… → +5.88 % (lean, add fuel).
    const air = 1;
    const fuelNow = air / (0.9 * 14.7);
    const fuelNeeded = air / (0.85 * 14.7);
    expect(lambdaErrorPct(0.9, 0.85)).toBeCloseTo(5.882353, 5);
    expect(lambdaErrorPct(0.9, 0.85)).toBeCloseTo((fuelNeeded / fuelNow - 1) * 100, 9);
    expect(lambdaErrorPct(0.8, 0.85)).toBeCloseTo(-5.882353, 5); // rich → remove fuel [CALC]
  });
});
