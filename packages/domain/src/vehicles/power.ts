import { DomainError } from '../errors';

/** 33 000 lbf·ft/min per hp divided by 2π rad per revolution: 5252.113. */
export const HP_TORQUE_CONSTANT = 33000 / (2 * Math.PI);
/** 60 000 W·s/min per kW divided by 2π rad per revolution: 9549.297. */
export const KW_TORQUE_CONSTANT = 60000 / (2 * Math.PI);
/** NIST SP 811 exact definitions: 1 ft = 0.3048 m, 1 lbf = 0.453 592 37 kg × 9.806 65 m/s². */
const METRES_PER_FOOT = 0.3048;
const NEWTONS_PER_LBF = 0.45359237 * 9.80665;
export const NM_PER_LBFT = METRES_PER_FOOT * NEWTONS_PER_LBF;
/** 1 mechanical hp = 550 ft·lbf/s ≈ 745.7 W. */
export const WATTS_PER_HP = 550 * NM_PER_LBFT;

/** Reference conditions of SAE J1349 and ISO 1585: 25 °C, 99 kPa dry air. */
const REF_TEMP_K = 298;
const REF_DRY_PRESSURE_KPA = 99;
/** The standards' published formulas add 273 (not 273.15) to °C; their worked values depend on it. */
const CELSIUS_OFFSET = 273;
/** ISO 1585 accepts its factor only within this range; outside it the test must be repeated nearer reference. */
export const ISO1585_VALID_RANGE = [0.93, 1.07] as const;

export const horsepowerFromTorque = (lbft: number, rpm: number): number =>
  (lbft * rpm) / HP_TORQUE_CONSTANT;
export const torqueLbftFromHorsepower = (hp: number, rpm: number): number =>
  (hp * HP_TORQUE_CONSTANT) / rpm;
export const kilowattsFromTorque = (nm: number, rpm: number): number =>
  (nm * rpm) / KW_TORQUE_CONSTANT;
export const torqueNmFromKilowatts = (kw: number, rpm: number): number =>
  (kw * KW_TORQUE_CONSTANT) / rpm;

export const kwToHp = (kw: number): number => (kw * 1000) / WATTS_PER_HP;
export const hpToKw = (hp: number): number => (hp * WATTS_PER_HP) / 1000;
export const nmToLbft = (nm: number): number => nm / NM_PER_LBFT;
export const lbftToNm = (lbft: number): number => lbft * NM_PER_LBFT;

export interface AmbientConditions {
  /** Intake air temperature, °C. */
  airTempC: number;
  /** Dry-air partial pressure (barometric minus water vapour), kPa. */
  dryPressureKpa: number;
}

function assertAmbient({ airTempC, dryPressureKpa }: AmbientConditions): void {
  if (!Number.isFinite(airTempC) || airTempC < -40 || airTempC > 60) {
    throw new DomainError(
      'validation',
      `Air temperature must be between −40 and 60 °C, got ${airTempC}.`,
    );
  }
  if (!Number.isFinite(dryPressureKpa) || dryPressureKpa < 50 || dryPressureKpa > 110) {
    throw new DomainError(
      'validation',
      `Dry air pressure must be between 50 and 110 kPa, got ${dryPressureKpa}.`,
    );
  }
}

/** SAE J1349 (2004 form): CF = 1.176·(99/p_d)·√((T+273)/298) − 0.176; multiply observed power by it. */
export function saeJ1349CorrectionFactor(ambient: AmbientConditions): number {
  assertAmbient(ambient);
  const tempRatio = (ambient.airTempC + CELSIUS_OFFSET) / REF_TEMP_K;
  return 1.176 * (REF_DRY_PRESSURE_KPA / ambient.dryPressureKpa) * Math.sqrt(tempRatio) - 0.176;
}

export interface Iso1585Correction {
  factor: number;
  /** False when the factor lies outside 0.93–1.07, where ISO 1585 does not accept the correction. */
  withinValidRange: boolean;
}

/** ISO 1585 / ECE R85 for spark-ignition engines: α = (99/p_d)^1.2 · (T/298)^0.6. */
export function iso1585CorrectionFactor(ambient: AmbientConditions): Iso1585Correction {
  assertAmbient(ambient);
  const factor =
    (REF_DRY_PRESSURE_KPA / ambient.dryPressureKpa) ** 1.2 *
    ((ambient.airTempC + CELSIUS_OFFSET) / REF_TEMP_K) ** 0.6;
  const [lo, hi] = ISO1585_VALID_RANGE;
  return { factor, withinValidRange: factor >= lo && factor <= hi };
}
