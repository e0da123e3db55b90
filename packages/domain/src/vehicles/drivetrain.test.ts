import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { evaluate } from 'mathjs';
import {
  engineRpmAt,
  gearFromRpmAndSpeed,
  kmhToMph,
  mphToKmh,
  roadSpeedKmh,
  speedTable,
} from './drivetrain';
import { parseTyreSize, rollingCircumference } from './tyre';

const C_245_40R20 = parseTyreSize('245/40R20').circumferenceMm;
// A plausible six-speed for tests of the maths only; checks below do not depend on these being any real car's.
const GEARS = [3.36, 2.09, 1.47, 1.1, 0.87, 0.72] as const;

describe('roadSpeedKmh / engineRpmAt', () => {
  it('3000 rpm in 1.00 gear, 3.15 final, 245/40R20 → 126.38 km/h', () => {
    // REFERENCES.md: km/h = rpm·C[m]·60 / (1000·gear·final) [CALC]
    expect(roadSpeedKmh(3000, 1.0, 3.15, C_245_40R20)).toBeCloseTo(126.38, 2);
  });

  it('a measured rolling circumference of 2150 mm gives 122.85 km/h in the same case', () => {
    // 3000·2.150·60 / (1000·1.00·3.15) = 387000/3150 = 122.857 km/h [CALC]; 2.8 % below the unloaded size's 126.38
    const { circumferenceMm } = rollingCircumference({
      tyreSize: '245/40R20',
      rollingCircumferenceMm: 2150,
    });
    expect(roadSpeedKmh(3000, 1.0, 3.15, circumferenceMm)).toBeCloseTo(122.857, 3);
    const unloaded = rollingCircumference({ tyreSize: '245/40R20', rollingCircumferenceMm: null });
    expect(roadSpeedKmh(3000, 1.0, 3.15, unloaded.circumferenceMm)).toBeCloseTo(126.38, 2);
  });

  it('round-trips speed ↔ rpm (property)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 500, max: 9000, noNaN: true }),
        fc.double({ min: 0.5, max: 5, noNaN: true }),
        fc.double({ min: 2, max: 5, noNaN: true }),
        fc.double({ min: 1500, max: 2600, noNaN: true }),
        (rpm, gear, final, circ) => {
          expect(engineRpmAt(roadSpeedKmh(rpm, gear, final, circ), gear, final, circ)).toBeCloseTo(
            rpm,
            6,
          );
        },
      ),
    );
  });

  it('refuses a zero ratio', () => {
    expect(() => roadSpeedKmh(3000, 0, 3.15, C_245_40R20)).toThrow(
      expect.objectContaining({ code: 'validation' }),
    );
  });
});

describe('gearFromRpmAndSpeed', () => {
  it('recovers the gear used to make the sample, despite ±2 % noise (property)', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 0, max: GEARS.length - 1 }),
        fc.double({ min: 1500, max: 7000, noNaN: true }),
        fc.double({ min: -0.02, max: 0.02, noNaN: true }),
        (index, rpm, noise) => {
          const speed = roadSpeedKmh(rpm, GEARS[index]!, 3.15, C_245_40R20) * (1 + noise);
          fc.pre(speed >= 5);
          expect(gearFromRpmAndSpeed(rpm, speed, GEARS, 3.15, C_245_40R20)).toBe(index + 1);
        },
      ),
    );
  });

  it('answers null when stopped, rolling slowly or slipping the clutch', () => {
    expect(gearFromRpmAndSpeed(900, 0, GEARS, 3.15, C_245_40R20)).toBeNull();
    expect(gearFromRpmAndSpeed(1200, 3, GEARS, 3.15, C_245_40R20)).toBeNull();
    // 4000 rpm at 20 km/h: no gear of this box is that short
    expect(gearFromRpmAndSpeed(4000, 20, GEARS, 3.15, C_245_40R20)).toBeNull();
    expect(gearFromRpmAndSpeed(Number.NaN, 50, GEARS, 3.15, C_245_40R20)).toBeNull();
  });

  it('refuses an empty gearbox', () => {
    expect(() => gearFromRpmAndSpeed(3000, 50, [], 3.15, C_245_40R20)).toThrow(
      expect.objectContaining({ code: 'validation' }),
    );
  });
});

describe('speedTable', () => {
  it('lists each gear per 1000 rpm and at the limiter', () => {
    const rows = speedTable({
      gearRatios: [1.0],
      finalDrive: 3.15,
      tyreCircumferenceMm: C_245_40R20,
      revLimitRpm: 6000,
    });
    // same [CALC] rule as above: 126.38 km/h at 3000 rpm, so 42.13 per 1000 and 252.77 at 6000
    expect(rows).toHaveLength(1);
    expect(rows[0]!.kmhPer1000Rpm).toBeCloseTo(126.38 / 3, 2);
    expect(rows[0]!.kmhAtRevLimit).toBeCloseTo(126.38 * 2, 1);
  });
});

describe('km/h ↔ mph', () => {
  it('agrees with mathjs', () => {
    // oracle: mathjs unit definitions (international mile 1609.344 m) [STD]
    expect(kmhToMph(100)).toBeCloseTo(evaluate('100 km/h to mi/h').toNumber('mi/h') as number, 10);
    expect(mphToKmh(60)).toBeCloseTo(evaluate('60 mi/h to km/h').toNumber('km/h') as number, 10);
  });
});
