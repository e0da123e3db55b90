import { unit } from 'mathjs';
import { stoichAfr } from '../vehicles/fuel';
import { describe, expect, it } from 'vitest';
import type { Quantity } from './channels';
import {
  STANDARD_ATMOSPHERE_KPA,
  UNIT_CHOICES,
  isUnitOf,
  lambdaConversion,
  unitConversion,
} from './units';

// Oracle: mathjs unit definitions (independent of this code). Each expectation converts one source unit.
const convert = (
  quantity: Parameters<typeof unitConversion>[0],
  text: string,
  value: number,
  gauge = false,
) => {
  const c = unitConversion(quantity, text, gauge);
  if (c === null) throw new Error(`no conversion for ${text}`);
  return value * c.scale + c.offset;
};

describe('unit conversions against mathjs', () => {
  it('converts speed, temperature, pressure, mass flow and time', () => {
    expect(convert('speed', 'mph', 60)).toBeCloseTo(unit(60, 'mi/h').toNumber('km/h'), 9); // [3P] mathjs; mile = 1609.344 m [STD]
    expect(convert('speed', 'm/s', 10)).toBeCloseTo(unit(10, 'm/s').toNumber('km/h'), 9); // [3P] mathjs
    expect(convert('temperature', '°F', 212)).toBeCloseTo(unit(212, 'degF').toNumber('degC'), 9); // [3P] mathjs; 212 °F = 100 °C
    expect(convert('temperature', 'degF', -40)).toBeCloseTo(unit(-40, 'degF').toNumber('degC'), 9); // [3P] mathjs
    expect(convert('temperature', 'K', 300)).toBeCloseTo(unit(300, 'K').toNumber('degC'), 9); // [3P] mathjs
    expect(convert('pressure', 'psi', 14.5)).toBeCloseTo(unit(14.5, 'psi').toNumber('kPa'), 6); // [3P] mathjs
    expect(convert('pressure', 'bar', 1.2)).toBeCloseTo(unit(1.2, 'bar').toNumber('kPa'), 9); // [3P] mathjs
    expect(convert('pressure', 'inHg', 29.92)).toBeCloseTo(
      unit(29.92 * 25.4, 'mmHg').toNumber('kPa'),
      2,
    ); // [3P] mathjs mmHg; 1 in = 25.4 mm [STD]
    expect(convert('mass_flow', 'lb/min', 10)).toBeCloseTo(
      unit(10, 'lbm/minute').toNumber('g/s'),
      9,
    ); // [3P] mathjs
    expect(convert('mass_flow', 'kg/h', 360)).toBeCloseTo(unit(360, 'kg/hour').toNumber('g/s'), 9); // [3P] mathjs
    expect(convert('time', 'ms', 1500)).toBeCloseTo(unit(1500, 'ms').toNumber('s'), 12); // [3P] mathjs
  });

  it('makes gauge (boost) pressure absolute with one standard atmosphere', () => {
    const atm = unit(1, 'atm').toNumber('kPa'); // [STD] ISO 2533 standard atmosphere, via mathjs [3P]
    expect(STANDARD_ATMOSPHERE_KPA).toBeCloseTo(atm, 9);
    expect(convert('pressure', 'psi', 10, true)).toBeCloseTo(
      unit(10, 'psi').toNumber('kPa') + atm,
      6,
    );
    expect(convert('pressure', 'psig', 10)).toBeCloseTo(unit(10, 'psi').toNumber('kPa') + atm, 6);
    expect(convert('pressure', 'psia', 10, true)).toBeCloseTo(unit(10, 'psi').toNumber('kPa'), 6);
    expect(unitConversion('pressure', 'psi', true)?.unit).toBe('psi (gauge)');
  });

  it('turns AFR into lambda with the stoichiometric ratio', () => {
    // REFERENCES "lambda": λ = AFR / AFR_stoich; 12.5 AFR gasoline (14.7) → λ 0.850 [definition]
    expect(12.5 * lambdaConversion('afr', 14.7).scale).toBeCloseTo(0.85, 3);
    expect(lambdaConversion('lambda', 14.7).scale).toBe(1);
  });

  it('converts the suffix spellings of script-style names', () => {
    expect(convert('mass_flow', 'lbmin', 2)).toBeCloseTo(unit(2, 'lbm/minute').toNumber('g/s'), 9); // [3P] mathjs
    expect(convert('rotational_speed', 'min', 3000)).toBe(3000); // rpm = revolutions per minute [definition]
    expect(convert('speed', 'kph', 100)).toBe(100);
    expect(convert('temperature', 'f', 212)).toBeCloseTo(unit(212, 'degF').toNumber('degC'), 9); // [3P] mathjs
    expect(convert('pressure', 'kPag', 50)).toBeCloseTo(50 + unit(1, 'atm').toNumber('kPa'), 9); // [3P] mathjs atm; ISO 2533 [STD]
    expect(convert('pressure', 'bar abs', 1.5)).toBeCloseTo(unit(1.5, 'bar').toNumber('kPa'), 9); // [3P] mathjs
    expect(unitConversion('pressure', 'psig', false)?.gauge).toBe(true);
  });

  it('offers every unit choice of a quantity as a unit the importer reads', () => {
    for (const [quantity, choices] of Object.entries(UNIT_CHOICES))
      for (const choice of choices)
        expect(isUnitOf(quantity as Quantity, choice.value), `${quantity} ${choice.value}`).toBe(true);
  });

  it('refuses a unit of another quantity', () => {
    expect(unitConversion('temperature', 'psi', false)).toBeNull();
  });
});

describe('stoichiometric ratios used for AFR logs', () => {
  it('match REFERENCES "stoichiometric AFR"', () => {
    expect(stoichAfr({ kind: 'gasoline' })).toBeCloseTo(14.7, 1); // US DOE Alternative Fuels Data Center [3P]
    expect(stoichAfr({ kind: 'ethanol_blend', ethanolPct: 85 })).toBeCloseTo(9.81, 2); // mass-weighted blend [CALC]
    expect(stoichAfr({ kind: 'ethanol_blend', ethanolPct: 10 })).toBeCloseTo(14.1, 2); // mass-weighted blend [CALC]
  });
});
