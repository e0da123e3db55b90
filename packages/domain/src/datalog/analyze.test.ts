import { describe, expect, it } from 'vitest';
import { analyzeDatalog } from './analyze';
import { defaultLogRequest } from './log-request';
import type { DatalogReport } from './report';
import { readDatalog } from './series';
import { DEMO_VEHICLE, generateLog, type GenerateLogOptions } from './testing/generate-log';

const encode = (text: string) => new TextEncoder().encode(text);
const check = (report: DatalogReport, id: string) => report.checks.find((c) => c.id === id);

// Injected faults (demo values) and the tolerances they must be recovered within.
const TRIM_ERRORS: GenerateLogOptions['trimErrors'] = [
  { rpm: [2000, 2500], map: [40, 50], trimPct: 8 },
  { rpm: [3000, 3500], map: [70, 80], trimPct: -6 },
];
const LEAN = { aboveRpm: 5000, errorPct: 6 };
const FAULTS: GenerateLogOptions = {
  trimErrors: TRIM_ERRORS,
  leanWot: LEAN,
  pulls: [{ gears: [2] }, { gears: [3, 4] }],
  knock: [
    { pull: 0, atFraction: 0.5, peakDeg: 4 },
    { pull: 1, atFraction: 0.3, peakDeg: 2.5 },
    { pull: 1, atFraction: 0.8, peakDeg: 6 },
  ],
};

const STYLES: [string, GenerateLogOptions][] = [
  [
    'OBD-II names, metric, comma',
    { headerStyle: 'obd', units: 'metric', format: 'comma', gearChannel: true },
  ],
  [
    'abbreviations, metric, tab, two banks',
    { headerStyle: 'short', units: 'metric', format: 'tab', twoBanks: true },
  ],
  [
    'OBD-II names, imperial (°F, mph, boost psi, lb/min, AFR, ms)',
    { headerStyle: 'obd', units: 'imperial', format: 'comma', preamble: true },
  ],
  [
    'abbreviations, imperial, semicolon + decimal comma',
    { headerStyle: 'short', units: 'imperial', format: 'semicolon_decimal_comma', preamble: true },
  ],
];

describe.each(STYLES)('analyzeDatalog on a generated log: %s', (_, style) => {
  const log = generateLog({ ...FAULTS, ...style, seed: 7 });
  const report = analyzeDatalog(encode(log.text), {
    vehicle: DEMO_VEHICLE,
    logRequest: { ...defaultLogRequest(), wotGears: 2 },
  });

  it('maps every channel and passes the log checks', () => {
    expect(report.rows).toBe(Math.floor(log.truth.durationS * 20) + 1);
    expect(report.sampleRateHz).toBeCloseTo(20, 1);
    expect(report.checks.map((c) => [c.id, c.status])).toEqual([
      ['required_channels', 'pass'],
      ['engine_warm', 'pass'],
      ['full_throttle', 'pass'],
      ['wot_gears', 'pass'],
      ['sensor_sanity', 'pass'],
      // Imperial logs write AFR: its scale is checked against warm cruise.
      ...(style.units === 'imperial' ? [['afr_scale', 'pass']] : []),
      ...(style.twoBanks ? [['bank_split', 'pass']] : []),
    ]);
    expect(report.sensors).toEqual([]);
  });

  it('recovers each injected trim error within ±1 % and leaves other cells near zero', () => {
    for (const injected of TRIM_ERRORS) {
      const cell = report.fuelTrim.cells.find(
        (c) => c.rpm[0] === injected.rpm[0] && c.map?.[0] === injected.map[0],
      );
      expect(cell?.samples).toBeGreaterThanOrEqual(20);
      expect(cell?.meanTrimPct).toBeGreaterThan(injected.trimPct - 1);
      expect(cell?.meanTrimPct).toBeLessThan(injected.trimPct + 1);
      expect(cell?.correctionPct).toBe(cell?.meanTrimPct); // new = old·(1 + trim/100) [CP]
    }
    const others = report.fuelTrim.cells.filter(
      (c) => !TRIM_ERRORS.some((e) => e.rpm[0] === c.rpm[0] && e.map[0] === c.map?.[0]),
    );
    expect(others.length).toBeGreaterThan(10);
    for (const cell of others) expect(Math.abs(cell.meanTrimPct)).toBeLessThan(1.5);
  });

  it('finds the pulls, their gears and the lean rpm bins', () => {
    expect(report.wot.pulls.map((p) => p.gears)).toEqual([[2], [3, 4]]);
    report.wot.pulls.forEach((pull, i) => {
      const truth = log.truth.pulls[i];
      expect(pull.startS).toBeCloseTo(truth?.startS ?? 0, 0);
      expect(pull.maxPedalPct).toBe(100);
      for (const bin of pull.lambdaError) {
        const expected = bin.rpm[0] >= LEAN.aboveRpm ? LEAN.errorPct : 0;
        expect(Math.abs(bin.meanErrorPct - expected)).toBeLessThan(1);
        expect(bin.fuelCorrectionPct).toBe(bin.meanErrorPct);
      }
      expect(pull.lambdaError.some((b) => b.rpm[0] === LEAN.aboveRpm)).toBe(true);
    });
  });

  it('reports one knock event per burst at its peak', () => {
    expect(report.knock.events).toHaveLength(log.truth.knock.length);
    report.knock.events.forEach((event, i) => {
      expect(event.timeS).toBeCloseTo(log.truth.knock[i]?.timeS ?? 0, 1);
      expect(event.retardDeg).toBeCloseTo(log.truth.knock[i]?.peakDeg ?? 0, 1);
      expect(event.map).toBeGreaterThan(90);
      expect(event.gear).not.toBeNull();
    });
    expect(report.knock.maxRetardDeg).toBe(6);
  });
});

describe('analyzeDatalog faults the customer must redo', () => {
  it('fails engine_warm on a cold start', () => {
    const report = analyzeDatalog(encode(generateLog({ coldStart: true }).text));
    expect(check(report, 'engine_warm')).toMatchObject({
      status: 'fail',
      message: expect.stringMatching(/still cold/),
    });
    expect(report.fuelTrim.cells).toEqual([]);
  });

  it('warns when full throttle came before the requested warm-up minutes', () => {
    const report = analyzeDatalog(encode(generateLog({ warmupS: 200, cruiseS: 20 }).text));
    expect(check(report, 'engine_warm')?.status).toBe('warn');
  });

  it('fails full_throttle when the pedal was only half pressed', () => {
    const report = analyzeDatalog(
      encode(generateLog({ pulls: [{ gears: [3], pedalPct: 50 }] }).text),
    );
    expect(check(report, 'full_throttle')).toMatchObject({
      status: 'fail',
      message: expect.stringMatching(/only reached 50 %/),
    });
    expect(report.wot.pulls).toEqual([]);
    expect(check(report, 'wot_gears')?.status).toBe('fail');
  });

  it('warns on wot_gears when fewer gears than requested were pulled, and when the gear is unknown', () => {
    const log = encode(generateLog({ pulls: [{ gears: [3] }] }).text);
    const request = { ...defaultLogRequest(undefined, 2) };
    expect(
      check(analyzeDatalog(log, { vehicle: DEMO_VEHICLE, logRequest: request }), 'wot_gears'),
    ).toMatchObject({ status: 'warn', message: expect.stringMatching(/1 gear \(3rd\)/) });
    // Without the vehicle's ratios the gears are counted from the steps of rpm/speed.
    expect(check(analyzeDatalog(log, { logRequest: request }), 'wot_gears')).toMatchObject({
      status: 'warn',
      message: expect.stringMatching(/1 gear held/),
    });
    expect(
      check(analyzeDatalog(log, { logRequest: request, map: { vehicle_speed: '' } }), 'wot_gears')
        ?.message,
    ).toMatch(/could not be told/);
  });

  it('flags a dead sensor as flatline', () => {
    const report = analyzeDatalog(encode(generateLog({ deadSensor: 'maf' }).text));
    expect(report.sensors).toEqual([
      expect.objectContaining({ channel: 'maf', issue: 'flatline' }),
    ]);
    expect(check(report, 'sensor_sanity')?.status).toBe('fail');
  });

  it('fails required_channels when a requested channel is missing', () => {
    const report = analyzeDatalog(encode(generateLog().text), {
      logRequest: { ...defaultLogRequest('v8'), wotGears: 1 },
    });
    expect(check(report, 'required_channels')).toMatchObject({
      status: 'fail',
      message: expect.stringMatching(
        /short-term fuel trim, bank 2 and long-term fuel trim, bank 2/,
      ),
    });
  });
});

describe('sensor dropouts and impossible readings', () => {
  const rows: string[] = ['Time (s),RPM,Coolant (°C),MAP (kPa)'];
  for (let i = 0; i < 400; i++) {
    const t = i < 200 ? i * 0.1 : i * 0.1 + 2; // a 2 s hole in the log
    const coolant = i >= 300 && i < 310 ? 215 : 90;
    const map = i >= 100 && i < 120 ? '' : String(40 + (i % 7));
    rows.push(`${t.toFixed(1)},${1500 + (i % 50) * 10},${coolant},${map}`);
  }
  const report = analyzeDatalog(encode(rows.join('\n')));

  it('reports time gaps, blank runs and out-of-range values in plain words', () => {
    expect(report.sensors).toEqual([
      {
        channel: 'time',
        issue: 'dropout',
        message: expect.stringMatching(/skipped samples once \(longest gap 2\.1 s\)/),
      },
      {
        channel: 'coolant_temp',
        issue: 'out_of_range',
        message: expect.stringMatching(/read 215°C in 10 samples/),
      },
      {
        channel: 'map',
        issue: 'dropout',
        message: expect.stringMatching(/dropped out once \(longest 2\.1 s\)/),
      },
    ]);
    expect(check(report, 'sensor_sanity')?.status).toBe('fail');
  });
});

describe('fuel and units', () => {
  it('converts an E85 AFR log with the blend stoichiometric ratio', () => {
    // REFERENCES: E85 stoich ≈ 9.8 (mass-weighted blend, [CALC]); the generator writes AFR = λ·stoich.
    const log = generateLog({
      units: 'imperial',
      fuel: { kind: 'ethanol_blend', ethanolPct: 85 },
      pulls: [{ gears: [3] }],
    });
    const e85 = analyzeDatalog(encode(log.text), {
      fuel: { kind: 'ethanol_blend', ethanolPct: 85 },
    });
    expect(e85.fuel.stoichAfr).toBeCloseTo(9.81, 1);
    expect(e85.units.lambda_meas).toMatch(/^AFR/);
    for (const bin of e85.wot.pulls[0]?.lambdaError ?? [])
      expect(Math.abs(bin.meanErrorPct)).toBeLessThan(1);
    // The fuel choice scales every AFR channel alike: the absolute lambda changes by the ratio of the stoich values.
    const asGasoline = readDatalog(encode(log.text));
    const asE85 = readDatalog(encode(log.text), {
      fuel: { kind: 'ethanol_blend', ethanolPct: 85 },
    });
    const ratio =
      (asGasoline.channels.lambda_meas?.[0] ?? 0) / (asE85.channels.lambda_meas?.[0] ?? 1);
    expect(ratio).toBeCloseTo(e85.fuel.stoichAfr / 14.7, 4); // λ = AFR / AFR_stoich [definition]
  });

  it('serves the canonical series for charts and reports progress up to 1', () => {
    const seen: number[] = [];
    const series = readDatalog(encode(generateLog({ units: 'imperial' }).text), {
      onProgress: (f) => seen.push(f),
    });
    expect(series.time[1]).toBeCloseTo(0.05, 6);
    expect(series.units).toMatchObject({
      time: 'ms',
      map: 'psi (gauge)',
      coolant_temp: '°F',
      vehicle_speed: 'mph',
    });
    expect(series.notes.join(' ')).toMatch(/101\.325 kPa/);
    expect(seen.at(-1)).toBeCloseTo(0.9, 6);
    expect([...seen].sort((a, b) => a - b)).toEqual(seen);
  });

  it('reads a unitless "Boost" column as gauge kPa and says so', () => {
    const series = readDatalog(encode('Time,RPM,Boost\n0,3000,50\n0.1,3100,60\n'));
    expect(series.channels.map?.[0]).toBeCloseTo(50 + 101.325, 4); // ISO 2533 standard atmosphere [STD]
    expect(series.units.map).toBe('kPa (gauge) (assumed)');
    expect(series.notes.join(' ')).toMatch(/gauge \(boost\) pressure/);
  });

  it('asks for --map when no time column is found', () => {
    expect(() => readDatalog(encode('Stamp,RPM\n0,800\n'))).toThrow(/--map time=<header>/);
  });
});
