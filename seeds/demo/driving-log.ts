import { parseTyreSize, roadSpeedKmh, type VehicleInput } from '@revloop/domain/vehicles';

// A demo datalog that reads like a real drive of one vehicle: idle, warm-up in town, a steady cruise, one
// full-throttle pull and the coast-down after it. Every number in here is invented demo data, not a reference value.

export interface DrivingLogOptions {
  seed: number;
  /** Gears of the full-throttle pull, in order: one gear on the first log, two or three later. */
  wotGears: number[];
  rateHz?: number;
  /** The pedal stays this far down in the pull (a half-hearted pull when below 95). */
  pedalPct?: number;
  /** A knock-retard burst this deep, at this share of the pull. */
  knock?: { atFraction: number; peakDeg: number };
  /** Measured λ this much leaner than commanded (percent) above this rpm in the pull. */
  leanWot?: { aboveRpm: number; errorPct: number };
  /** Combined trim the ECU needs in one part-throttle area (+ = it adds fuel: that area runs lean). */
  leanCell?: { rpm: [number, number]; map: [number, number]; trimPct: number };
  /** Bank-2 trims, for V and flat engines. */
  twoBanks?: boolean;
}

interface Sample {
  rpm: number;
  speed: number;
  gear: number;
  pedal: number;
  map: number;
  lambdaCmd: number;
  fuelCut: boolean;
  pull: boolean;
}

const G = 9.81;
const AMBIENT_C = 21;
const IDLE_RPM = 760;

/** Torque at full load, N·m: a plain curve for the engine type (turbo flat from spool-up, NA peaking late). */
function fullLoadTorque(v: VehicleInput, rpm: number): number {
  const litres = v.engine.displacementL;
  const redline = v.revLimitRpm;
  switch (v.engine.aspiration) {
    case 'turbocharged': {
      const spool = Math.min(1, Math.max(0.45, (rpm - 1500) / 1500));
      const fade = rpm > 0.8 * redline ? 1 - (0.25 * (rpm - 0.8 * redline)) / (0.2 * redline) : 1;
      return 165 * litres * spool * fade;
    }
    case 'supercharged':
      return 140 * litres * (0.8 + 0.2 * Math.min(1, rpm / (0.6 * redline)));
    default: {
      const x = rpm / (0.7 * redline);
      return 98 * litres * (0.78 + 0.22 * (1 - (x - 1) ** 2));
    }
  }
}

/** Boost the engine makes at full load, kPa absolute, rising as the turbo spools or the blower spins up. */
function fullLoadMap(v: VehicleInput, rpm: number): number {
  if (v.engine.aspiration === 'turbocharged') return 99 + 125 * Math.min(1, Math.max(0, (rpm - 1800) / 1400));
  if (v.engine.aspiration === 'supercharged') return 99 + 70 * Math.min(1, rpm / (0.75 * v.revLimitRpm));
  return 97;
}

/** The gears of a pull that keep its end below about 175 km/h: later logs want two or three, the first one. */
export function pullGears(v: VehicleInput, round: number): number[] {
  const ratios = v.transmission.gearRatios;
  const circumference = parseTyreSize(v.tyreSize).circumferenceMm;
  const topSpeed = (gear: number) => roadSpeedKmh(v.revLimitRpm - 150, ratios[gear - 1]!, v.finalDrive, circumference);
  if (round <= 1) return [topSpeed(3) <= 150 ? 3 : 2];
  const gears = [2, 3];
  if (ratios.length > 4 && topSpeed(4) <= 175) gears.push(4);
  return gears;
}

export function generateDrivingLog(v: VehicleInput, o: DrivingLogOptions): string {
  const rate = o.rateHz ?? 10;
  const dt = 1 / rate;
  let seed = o.seed >>> 0;
  const random = () => {
    seed = (seed + 0x6d2b79f5) >>> 0;
    let t = seed;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  const gauss = () => Math.sqrt(-2 * Math.log(1 - random())) * Math.cos(2 * Math.PI * random());
  const ratios = v.transmission.gearRatios;
  const circumferenceMm = parseTyreSize(v.tyreSize).circumferenceMm;
  const rpmAt = (kmh: number, gear: number) => (kmh * 1000 * ratios[gear - 1]! * v.finalDrive) / ((circumferenceMm / 1000) * 60);
  const boosted = v.engine.aspiration !== 'naturally_aspirated';
  const massKg = v.curbMassKg + 90;
  const wheelRadiusM = circumferenceMm / 1000 / (2 * Math.PI);
  const samples: Sample[] = [];

  let speed = 0;
  let gear = 0;
  const push = (s: Partial<Sample> & { pedal: number }) =>
    samples.push({ rpm: IDLE_RPM, speed, gear, map: 30, lambdaCmd: 1, fuelCut: false, pull: false, ...s });

  /** Idle in neutral; a cold engine idles faster. */
  const idle = (seconds: number, coldRpm = IDLE_RPM) => {
    gear = 0;
    speed = 0;
    for (let t = 0; t < seconds; t += dt) push({ rpm: coldRpm - (coldRpm - IDLE_RPM) * (t / seconds), pedal: 0, map: 31 });
  };
  /** Drives to a target speed at a gentle rate, shifting up at shiftRpm, then holds it; light pedal, no boost. */
  const driveTo = (targetKmh: number, holdS: number, shiftRpm: number, accel = 1.4) => {
    if (gear === 0) gear = 1;
    while (speed < targetKmh - 0.5) {
      speed = Math.min(targetKmh, speed + accel * 3.6 * dt);
      if (rpmAt(speed, gear) > shiftRpm && gear < ratios.length) {
        // A quick lift while the next gear goes in: rpm falls to the new gear's speed.
        for (let t = 0; t < 0.4; t += dt) push({ rpm: rpmAt(speed, gear) * 0.95, pedal: 2, map: 28 });
        gear++;
      }
      const rpm = Math.max(IDLE_RPM + 300, rpmAt(speed, gear));
      const load = 0.18 + 0.12 * accel + speed / 900;
      push({ rpm, pedal: 8 + 55 * load, map: Math.min(88, 26 + 70 * load) });
    }
    while (gear > 1 && rpmAt(speed, gear) < 1150) gear--;
    for (let t = 0; t < holdS; t += dt) {
      const wobble = 1.5 * Math.sin(t / 7) + 0.3 * gauss();
      speed = Math.max(5, targetKmh + wobble);
      const load = 0.1 + speed / 700 + 0.03 * Math.sin(t / 3);
      push({ rpm: rpmAt(speed, gear), pedal: 6 + 45 * load, map: Math.min(80, 24 + 75 * load) });
    }
  };
  /** Brakes to a stop (or a lower speed), shifting down; injectors off while the rpm is high. */
  const slowTo = (targetKmh: number, decel = 2.5) => {
    while (speed > targetKmh + 0.5) {
      speed = Math.max(targetKmh, speed - decel * 3.6 * dt);
      while (gear > 1 && rpmAt(speed, gear) < 1100) gear--;
      const rpm = speed < 12 ? IDLE_RPM + 80 : rpmAt(speed, gear);
      if (speed < 12) gear = 0;
      push({ rpm, pedal: 0, map: rpm > 1500 ? 21 : 30, fuelCut: rpm > 1500 });
    }
  };
  /** The full-throttle pull: the wheel force from the torque curve and gearing sets how fast the rpm climbs. */
  const pull = (gears: number[], pedalPct: number) => {
    const first = gears[0]!;
    gear = first;
    const startRpm = boosted ? 2300 : 2600;
    const lead = rpmAt(speed, gear);
    const leadIn = Math.max(2, Math.round(Math.abs(startRpm - lead) / 300));
    for (let t = 0; t < leadIn; t += dt) {
      const rpm = lead + ((startRpm - lead) * t) / leadIn;
      speed = (rpm * (circumferenceMm / 1000) * 60) / (1000 * ratios[gear - 1]! * v.finalDrive);
      push({ rpm, pedal: 18, map: 42 });
    }
    const full = pedalPct >= 95;
    pullStart = samples.length;
    let boost = 99;
    let elapsed = 0;
    for (const [k, g] of gears.entries()) {
      gear = g;
      const ratio = ratios[g - 1]!;
      let rpm = rpmAt(speed, g);
      while (rpm < v.revLimitRpm - 150) {
        const load = full ? 1 : pedalPct / 110;
        const torque = fullLoadTorque(v, rpm) * load;
        const inertia = 1 + 0.04 + 0.0025 * (ratio * v.finalDrive) ** 2;
        const drag = 0.36 * (speed / 3.6) ** 2 + 0.012 * massKg * G;
        const accel = Math.min(0.95 * G, ((torque * ratio * v.finalDrive * 0.88) / wheelRadiusM - drag) / (massKg * inertia));
        if (accel <= 0.05) break;
        speed += accel * 3.6 * dt;
        rpm = rpmAt(speed, g);
        // The manifold follows the target with the lag of a turbo spooling up.
        const target = full ? fullLoadMap(v, rpm) : 30 + pedalPct * 0.6;
        boost += (target - boost) * Math.min(1, dt / (v.engine.aspiration === 'turbocharged' ? 0.6 : 0.15));
        const lambdaCmd = !full ? 1 : boosted ? 0.84 - 0.06 * Math.min(1, (rpm - 2500) / 3000) : 0.86 - 0.01 * Math.min(1, rpm / v.revLimitRpm);
        push({ rpm, pedal: pedalPct + 0.4 * gauss(), map: boost, lambdaCmd: elapsed < 0.2 ? 1 - (1 - lambdaCmd) * (elapsed / 0.2) : lambdaCmd, pull: true });
        elapsed += dt;
      }
      if (k < gears.length - 1) {
        // Pedal held on the floor through the shift; the rpm drops to the next gear at the same road speed.
        for (let t = 0; t < 0.3; t += dt) push({ rpm: rpmAt(speed, g) * (1 - t), pedal: pedalPct, map: boost * 0.9, lambdaCmd: samples.at(-1)!.lambdaCmd, pull: true });
      }
    }
  };

  // Cold start, town driving with stops while the coolant climbs, then a steady road and the pull on a closed course.
  idle(40, 1150);
  const cityShift = 2300 + 200 * random();
  for (const [kmh, hold] of [
    [30, 20],
    [50, 35],
    [45, 25],
    [60, 40],
  ] as const) {
    driveTo(kmh, hold, cityShift);
    slowTo(0);
    idle(8);
  }
  driveTo(70, 30, cityShift + 200);
  driveTo(95, 70, 2500);
  slowTo(55);
  driveTo(55, 10, 2600);
  let pullStart = 0;
  pull(o.wotGears, o.pedalPct ?? 100);
  const pullEnd = samples.length;
  slowTo(60, 3.5);
  driveTo(60, 30, 2500);
  slowTo(0);
  idle(15);

  return toCsv(samples, { v, o, random, gauss, rate, pullStart, pullEnd });
}

interface Context {
  v: VehicleInput;
  o: DrivingLogOptions;
  random: () => number;
  gauss: () => number;
  rate: number;
  pullStart: number;
  pullEnd: number;
}

/** Adds what the sensors would show: temperatures, airflow, trims, measured λ, spark and knock. */
function toCsv(samples: Sample[], c: Context): string {
  const { v, o, gauss, random, rate } = c;
  const twoBanks = o.twoBanks ?? false;
  const knockAt = o.knock ? Math.round(c.pullStart + (c.pullEnd - c.pullStart) * o.knock.atFraction) : -1;
  const knockShape = [0.3, 0.7, 1, 0.8, 0.5, 0.3, 0.15, 0.05];
  const headers = [
    'Time (s)',
    'Engine RPM (rpm)',
    'Vehicle speed (km/h)',
    'Engine coolant temperature (°C)',
    'Intake air temperature (°C)',
    'Intake manifold absolute pressure (kPa)',
    'MAF air flow rate (g/s)',
    'Absolute throttle position (%)',
    'Accelerator pedal position D (%)',
    'Short term fuel trim—Bank 1 (%)',
    'Long term fuel trim—Bank 1 (%)',
    ...(twoBanks ? ['Short term fuel trim—Bank 2 (%)', 'Long term fuel trim—Bank 2 (%)'] : []),
    'Commanded equivalence ratio (λ)',
    'O2 sensor 1 equivalence ratio (λ)',
    'Knock retard (°)',
    'Timing advance (°)',
    'Gear',
  ];
  const lines = [headers.join(',')];
  // The long-term trims the ECU has learned per area, small as on a healthy engine, plus the lean area if any.
  const learned = (rpm: number, map: number) => {
    const base = 1.6 * Math.sin(rpm / 700 + map / 23) + 0.8 * Math.cos(map / 11);
    const lean = o.leanCell && rpm >= o.leanCell.rpm[0] && rpm < o.leanCell.rpm[1] && map >= o.leanCell.map[0] && map < o.leanCell.map[1];
    return lean ? base + o.leanCell!.trimPct : base;
  };
  let stft1 = 0;
  let stft2 = 0;
  let iat = AMBIENT_C + 4;
  for (const [i, s] of samples.entries()) {
    const time = i / rate;
    // Coolant climbs from about 30 °C and settles where the thermostat holds it.
    const coolant = 90.5 - 60 * Math.exp(-time / 105) + (time > 300 ? 1.2 * Math.sin(time / 35) : 0) + 0.15 * gauss();
    const heatSoak = s.speed < 10 ? 0.02 : -0.03 * (iat - AMBIENT_C - 2) * (s.speed / 100);
    iat += heatSoak + (s.pull && v.engine.aspiration !== 'naturally_aspirated' ? 0.04 : 0);
    const map = Math.max(18, s.map + 0.6 * gauss());
    const rpm = Math.max(0, s.rpm + (s.gear === 0 ? 12 * gauss() : 3 * gauss()));
    // Speed density: ṁ = p/(R·T)·Vd·VE·rpm/120.
    const ve = 0.82 + 0.1 * Math.min(1, rpm / v.revLimitRpm);
    const maf = ((map * 1000) / (287.05 * (iat + 273.15))) * (v.engine.displacementL / 1000) * ve * (rpm / 120) * 1000;
    const warm = coolant >= 40;
    const closedLoop = warm && !s.pull && !s.fuelCut && s.lambdaCmd === 1;
    // The learned trims apply whenever the engine is warm; short-term trims only work in closed loop.
    const lt1 = warm ? 0.75 * learned(rpm, map) : 0;
    const lt2 = warm ? 0.75 * learned(rpm + 250, map + 4) : 0;
    if (closedLoop) {
      // Short-term trims swing around what is left, as the oxygen sensor switches rich and lean.
      stft1 = 0.7 * stft1 + 0.3 * (learned(rpm, map) - lt1 + 1.4 * gauss());
      stft2 = 0.7 * stft2 + 0.3 * (learned(rpm + 250, map + 4) - lt2 + 1.4 * gauss());
    } else {
      stft1 = 0;
      stft2 = 0;
    }
    const lambdaCmd = warm || s.pull ? s.lambdaCmd : 0.95;
    const lean = o.leanWot && s.pull && rpm >= o.leanWot.aboveRpm ? o.leanWot.errorPct / 100 : 0;
    const lambdaMeas = s.fuelCut ? 1.45 + 0.1 * random() : lambdaCmd * (1 + lean) + (closedLoop ? 0.01 * Math.sin(i * 1.7) : 0) + 0.004 * gauss();
    const knock = i >= knockAt && i < knockAt + knockShape.length ? (o.knock?.peakDeg ?? 0) * knockShape[i - knockAt]! : 0;
    const base = s.pull ? (v.engine.aspiration === 'naturally_aspirated' ? 22 + rpm / 900 : 6 + rpm / 700) : 14 + rpm / 250 - (map - 30) * 0.2;
    const spark = Math.min(42, Math.max(-5, base)) - knock + 0.3 * gauss();
    const pedal = Math.max(0, Math.min(100, s.pedal));
    const throttle = s.gear === 0 && pedal === 0 ? 2.4 + 0.2 * gauss() : pedal === 0 ? 0.8 + 0.1 * random() : Math.min(100, pedal * 0.93 + 2);
    const row = [
      time.toFixed(1),
      rpm.toFixed(0),
      Math.max(0, s.speed).toFixed(1),
      coolant.toFixed(1),
      iat.toFixed(1),
      map.toFixed(1),
      maf.toFixed(2),
      throttle.toFixed(1),
      pedal.toFixed(1),
      (closedLoop ? stft1 : 0).toFixed(1),
      lt1.toFixed(1),
      ...(twoBanks ? [(closedLoop ? stft2 : 0).toFixed(1), lt2.toFixed(1)] : []),
      lambdaCmd.toFixed(3),
      lambdaMeas.toFixed(3),
      knock.toFixed(1),
      spark.toFixed(1),
      String(s.gear),
    ];
    lines.push(row.join(','));
  }
  return lines.join('\n') + '\n';
}
