import { describe, expect, it } from 'vitest';
import { axisLabel, formatChange, formatNumber, formatValue, groupByUnit, withUnit } from './units';

describe('formatValue', () => {
  it('writes each unit at the precision a tuner reads it', () => {
    // [CP] engine speed and road speed in whole units; λ to a thousandth; pressures, percentages and degrees to a tenth.
    expect(formatValue(6432.004, 'rpm')).toBe('6432 rpm');
    expect(formatValue(87.6, 'km/h')).toBe('88 km/h');
    expect(formatValue(91.7, '°C')).toBe('92 °C');
    expect(formatValue(101.325, 'kPa')).toBe('101.3 kPa');
    expect(formatValue(-3.25, '%')).toBe('−3.3 %');
    expect(formatValue(0.8234, 'λ')).toBe('λ 0.823');
    expect(formatValue(12.34, 'g/s')).toBe('12.3 g/s');
    expect(formatValue(3, '')).toBe('3');
  });

  it('puts a space before the unit symbol except for the plane-angle degree', () => {
    // [STD] BIPM, The International System of Units, 9th ed. (2019), 5.4.3: a space separates number and unit,
    // except for °, ′ and ″ of plane angle; "°C" keeps the space.
    expect(formatValue(4.5, '°')).toBe('4.5°');
    expect(formatValue(20, '°C')).toBe('20 °C');
  });

  it('never shows "−0" and shows a blank as a dash', () => {
    expect(formatValue(-0.04, '%')).toBe('0.0 %');
    expect(formatNumber(-0.0001, 'λ')).toBe('0.000');
    expect(formatValue(null, 'rpm')).toBe('—');
    expect(formatValue(Number.NaN, 'rpm')).toBe('—');
  });

  it('rounds as Intl.NumberFormat does at the same precision', () => {
    // Oracle: the platform's Intl.NumberFormat (ECMA-402), an independent implementation of fixed-precision rounding.
    const oracle = (v: number, d: number) =>
      new Intl.NumberFormat('en-US', { minimumFractionDigits: d, maximumFractionDigits: d, useGrouping: false }).format(v);
    for (const v of [0.1234, 12.55, 99.95, 1234.5678, 7021.49]) {
      expect(formatNumber(v, 'kPa')).toBe(oracle(v, 1));
      expect(formatNumber(v, 'λ')).toBe(oracle(v, 3));
    }
  });
});

describe('groupByUnit', () => {
  it('gives channels of one unit one axis, in order of first appearance', () => {
    const groups = groupByUnit([
      { channel: 'rpm', unit: 'rpm' },
      { channel: 'stft_b1', unit: '%' },
      { channel: 'map', unit: 'kPa' },
      { channel: 'ltft_b1', unit: '%' },
      { channel: 'gear', unit: '' },
    ]);
    expect(groups.map((g) => g.unit)).toEqual(['rpm', '%', 'kPa', '']);
    expect(groups[1]!.channels.map((c) => c.channel)).toEqual(['stft_b1', 'ltft_b1']);
    expect(new Set(groups.map((g) => g.axisId)).size).toBe(4);
    expect(groups.map((g) => axisLabel(g.unit))).toEqual(['rpm', '%', 'kPa', 'gear']);
  });
});

describe('formatChange', () => {
  it('signs a difference and keeps the unit', () => {
    expect(formatChange(120.4, 'rpm')).toBe('+120 rpm');
    expect(formatChange(-1.54, '°')).toBe('−1.5°');
    expect(formatChange(0.0204, 'λ')).toBe('+0.020');
    expect(formatChange(0.01, 'rpm')).toBe('±0 rpm');
    expect(formatChange(null, 'rpm')).toBe('—');
  });
});

describe('withUnit', () => {
  it('names a channel with its unit once', () => {
    expect(withUnit('engine speed', 'rpm')).toBe('engine speed (rpm)');
    expect(withUnit('measured lambda (wideband air-fuel ratio)', 'λ')).toBe('measured lambda (wideband air-fuel ratio), λ');
    expect(withUnit('gear', '')).toBe('gear');
  });
});
