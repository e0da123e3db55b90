import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { DomainError } from '../errors';
import { afrToLambda, ethanolMassFraction, lambdaToAfr, parseFuelOption, stoichAfr } from './fuel';

describe('stoichAfr', () => {
  it('uses the textbook single-fuel ratios', () => {
    // US DOE Alternative Fuels Data Center, fuel properties comparison: gasoline 14.7 by mass [3P]
    // (Heywood, Internal Combustion Engine Fundamentals, App. D gives 14.6 for CH1.87 [MEM])
    expect(stoichAfr({ kind: 'gasoline' })).toBe(14.7);
    // Heywood App. D: diesel ≈ 14.5, methanol 6.4–6.5 [MEM]
    expect(stoichAfr({ kind: 'diesel' })).toBe(14.5);
    expect(stoichAfr({ kind: 'methanol' })).toBeGreaterThanOrEqual(6.4);
    expect(stoichAfr({ kind: 'methanol' })).toBeLessThanOrEqual(6.5);
  });

  it('mixes ethanol blends by mass fraction', () => {
    // REFERENCES.md blend rule, ethanol 0.789 kg/L, gasoline 0.745 kg/L: E85 → 9.81, E10 → 14.10 [CALC]
    expect(stoichAfr({ kind: 'ethanol_blend', ethanolPct: 85 })).toBeCloseTo(9.81, 2);
    expect(stoichAfr({ kind: 'ethanol_blend', ethanolPct: 10 })).toBeCloseTo(14.1, 2);
    // pure ends of the blend are the pure fuels: gasoline 14.7, ethanol 9.0 (US DOE AFDC fuel properties) [3P]
    expect(stoichAfr({ kind: 'ethanol_blend', ethanolPct: 0 })).toBeCloseTo(14.7, 10);
    expect(stoichAfr({ kind: 'ethanol_blend', ethanolPct: 100 })).toBeCloseTo(9.0, 10);
  });

  it('E85 by mass is more than 85 % ethanol because ethanol is the denser fuel', () => {
    // 0.85·0.789 / (0.85·0.789 + 0.15·0.745) = 0.8572 [CALC]
    expect(ethanolMassFraction(85)).toBeCloseTo(0.8572, 4);
  });

  it('falls as ethanol rises (property)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 99 }), (pct) => {
        expect(stoichAfr({ kind: 'ethanol_blend', ethanolPct: pct + 1 })).toBeLessThan(
          stoichAfr({ kind: 'ethanol_blend', ethanolPct: pct }),
        );
      }),
    );
  });

  it('refuses impossible blends and ratios', () => {
    expect(() => stoichAfr({ kind: 'ethanol_blend', ethanolPct: 120 })).toThrow(DomainError);
    expect(() => stoichAfr({ kind: 'custom', stoichAfr: 0 })).toThrow(DomainError);
  });
});

describe('parseFuelOption', () => {
  it.each([
    ['gasoline', { kind: 'gasoline' }],
    ['  E85 ', { kind: 'ethanol_blend', ethanolPct: 85 }],
    ['e10', { kind: 'ethanol_blend', ethanolPct: 10 }],
    ['diesel', { kind: 'diesel' }],
    ['stoich=14.64', { kind: 'custom', stoichAfr: 14.64 }],
  ])('reads %s', (text, spec) => {
    expect(parseFuelOption(text)).toEqual(spec);
  });

  it.each(['', 'petrol95', 'e', 'e101', 'stoich=', 'stoich=abc', 'stoich=50'])(
    'refuses %j with a validation error',
    (text) => {
      expect(() => parseFuelOption(text)).toThrow(expect.objectContaining({ code: 'validation' }));
    },
  );
});

describe('lambda ↔ AFR', () => {
  it('λ = AFR / stoich', () => {
    // REFERENCES.md: 12.5 AFR on gasoline → λ 0.850 (definition) [CALC]
    expect(afrToLambda(12.5, 14.7)).toBeCloseTo(0.85, 3);
  });

  it('round-trips (property)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0.5, max: 2, noNaN: true }),
        fc.double({ min: 6, max: 17, noNaN: true }),
        (lambda, stoich) => {
          expect(afrToLambda(lambdaToAfr(lambda, stoich), stoich)).toBeCloseTo(lambda, 10);
        },
      ),
    );
  });
});
