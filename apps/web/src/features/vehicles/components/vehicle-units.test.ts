import { unit } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { parseTyreSize, roadSpeedKmh } from '@revloop/domain/vehicles';
import { circumferenceDeviation, formatLength, formatMass, formatSpeed } from './vehicle-units';

// Oracle: mathjs unit conversions (an independent implementation of the SI/imperial definitions).
const mph = (kmh: number) => unit(kmh, 'km/h').toNumber('mi/h');
const inches = (mm: number) => unit(mm, 'mm').toNumber('inch');
const pounds = (kg: number) => unit(kg, 'kg').toNumber('lbm');

describe('vehicle units for display', () => {
  it('shows the REFERENCES speed example in both unit systems', () => {
    // 3000 rpm, gear 1.00, final 3.15, 245/40R20 → 126.38 km/h [CALC] (REFERENCES "road speed").
    const kmh = roadSpeedKmh(3000, 1, 3.15, parseTyreSize('245/40R20').circumferenceMm);
    expect(formatSpeed(kmh, 'metric', 2)).toBe('126.38 km/h');
    expect(formatSpeed(kmh, 'imperial', 2)).toBe(`${mph(kmh).toFixed(2)} mph`);
    expect(formatSpeed(kmh, 'imperial', 2)).toBe('78.53 mph');
  });

  it('shows the tyre diameter of 245/40R20 in mm and inches', () => {
    // D = 20·25.4 + 2·(245·0.40) = 704.0 mm from the ISO 4000-1 / ETRTO designation's meaning [CALC] (REFERENCES "metric tyre size").
    expect(formatLength(704, 'metric')).toBe('704.0 mm');
    expect(formatLength(704, 'imperial')).toBe(`${inches(704).toFixed(2)} in`);
  });

  it('says how a measured rolling circumference compares with the tyre size', () => {
    // 2150 / (π·704.0) − 1 = −2.79 % [CALC]
    const size = parseTyreSize('245/40R20').circumferenceMm;
    expect(circumferenceDeviation(2150, size)).toBe('2.8 % shorter than');
    expect(circumferenceDeviation(2300, size)).toBe('4.0 % longer than');
    expect(circumferenceDeviation(size, size)).toBe('the same as');
  });

  it('shows curb mass in kg or lb', () => {
    expect(formatMass(1420, 'metric')).toBe('1,420 kg');
    expect(formatMass(1420, 'imperial')).toBe(`${Math.round(pounds(1420)).toLocaleString('en-US')} lb`);
  });
});
