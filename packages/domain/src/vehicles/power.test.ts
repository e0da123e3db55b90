import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { evaluate } from 'mathjs';
import {
  HP_TORQUE_CONSTANT,
  KW_TORQUE_CONSTANT,
  horsepowerFromTorque,
  hpToKw,
  iso1585CorrectionFactor,
  kilowattsFromTorque,
  kwToHp,
  lbftToNm,
  nmToLbft,
  saeJ1349CorrectionFactor,
  torqueLbftFromHorsepower,
  torqueNmFromKilowatts,
} from './power';

describe('power from torque', () => {
  it('400 N·m at 6000 rpm → 251.33 kW', () => {
    // REFERENCES.md: kW = N·m·rpm/9549.297 (definition; NIST SP 811 constants) [MEM]
    expect(kilowattsFromTorque(400, 6000)).toBeCloseTo(251.33, 2);
  });

  it('uses the published constants 5252.113 and 9549.297', () => {
    // REFERENCES.md, NIST SP 811 [MEM]
    expect(HP_TORQUE_CONSTANT).toBeCloseTo(5252.113, 3);
    expect(KW_TORQUE_CONSTANT).toBeCloseTo(9549.297, 3);
  });

  it('agrees with mathjs: P = τ·ω', () => {
    // oracle: mathjs unit system (lbf, ft, hp, N, m defined there independently); ω = 2π·rpm per minute [STD]
    const oracleHp = evaluate('300 lbf * ft * 2 pi * 5000 / minute to hp').toNumber('hp') as number;
    expect(horsepowerFromTorque(300, 5000)).toBeCloseTo(oracleHp, 6);
    const oracleKw = evaluate('400 N * m * 2 pi * 6000 / minute to kW').toNumber('kW') as number;
    expect(kilowattsFromTorque(400, 6000)).toBeCloseTo(oracleKw, 6);
  });

  it('converts units like mathjs', () => {
    // oracle: mathjs unit definitions [STD]; mathjs rounds hp to 745.6998715386 W, hence 6 digits
    expect(kwToHp(100)).toBeCloseTo(evaluate('100 kW to hp').toNumber('hp') as number, 6);
    expect(hpToKw(300)).toBeCloseTo(evaluate('300 hp to kW').toNumber('kW') as number, 6);
    expect(nmToLbft(400)).toBeCloseTo(
      evaluate('400 N m to lbf ft').toNumber('lbf ft') as number,
      6,
    );
    expect(lbftToNm(300)).toBeCloseTo(evaluate('300 lbf ft to N m').toNumber('N m') as number, 6);
  });

  it('hp and lbf·ft cross at 5252 rpm [CALC]', () => {
    expect(horsepowerFromTorque(350, HP_TORQUE_CONSTANT)).toBeCloseTo(350, 9);
  });

  it('round-trips torque ↔ power (property)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1, max: 2000, noNaN: true }),
        fc.double({ min: 500, max: 10000, noNaN: true }),
        (torque, rpm) => {
          expect(torqueNmFromKilowatts(kilowattsFromTorque(torque, rpm), rpm)).toBeCloseTo(
            torque,
            8,
          );
          expect(torqueLbftFromHorsepower(horsepowerFromTorque(torque, rpm), rpm)).toBeCloseTo(
            torque,
            8,
          );
        },
      ),
    );
  });
});

describe('correction factors', () => {
  it('SAE J1349 (2004 form) at 30 °C, 95 kPa dry → 1.0598', () => {
    // REFERENCES.md, SAE J1349 [3P: formula as quoted publicly]
    expect(saeJ1349CorrectionFactor({ airTempC: 30, dryPressureKpa: 95 })).toBeCloseTo(1.0598, 4);
  });

  it('both factors are 1 at the reference 25 °C, 99 kPa dry [CALC]', () => {
    expect(saeJ1349CorrectionFactor({ airTempC: 25, dryPressureKpa: 99 })).toBeCloseTo(1, 12);
    expect(iso1585CorrectionFactor({ airTempC: 25, dryPressureKpa: 99 }).factor).toBeCloseTo(1, 12);
  });

  it('ISO 1585 at 30 °C, 95 kPa dry → 1.0613, inside 0.93–1.07', () => {
    // REFERENCES.md, ISO 1585 / ECE R85 [MEM]
    const result = iso1585CorrectionFactor({ airTempC: 30, dryPressureKpa: 95 });
    expect(result.factor).toBeCloseTo(1.0613, 4);
    expect(result.withinValidRange).toBe(true);
  });

  it('ISO 1585 flags a factor outside 0.93–1.07 (hot, high altitude) [MEM]', () => {
    expect(iso1585CorrectionFactor({ airTempC: 40, dryPressureKpa: 85 }).withinValidRange).toBe(
      false,
    );
  });

  it('refuses impossible ambient readings', () => {
    expect(() => saeJ1349CorrectionFactor({ airTempC: 30, dryPressureKpa: 0 })).toThrow(
      expect.objectContaining({ code: 'validation' }),
    );
    expect(() => iso1585CorrectionFactor({ airTempC: Number.NaN, dryPressureKpa: 99 })).toThrow(
      expect.objectContaining({ code: 'validation' }),
    );
  });
});
