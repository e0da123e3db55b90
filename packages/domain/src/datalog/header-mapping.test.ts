import { describe, expect, it } from 'vitest';
import { DomainError } from '../errors';
import { headerSignature, mapHeaders } from './header-mapping';

const headerOf = (headers: string[], overrides?: Record<string, string>) => {
  const mapping = mapHeaders(headers, overrides);
  return Object.fromEntries(Object.entries(mapping.channels).map(([c, m]) => [c, m.header]));
};

describe('mapHeaders', () => {
  it('leaves a channel out when its override names no column, and frees that column', () => {
    const headers = ['Time (s)', 'RPM', 'Knock retard (deg)'];
    expect(headerOf(headers, { knock_retard: '' })).toEqual({ time: 'Time (s)', rpm: 'RPM' });
    expect(mapHeaders(headers, { knock_retard: ' ' }).unmapped).toEqual(['Knock retard (deg)']);
  });

  it('reads OBD-II PID names (SAE J1979 titles)', () => {
    const headers = [
      'Time (s)',
      'Engine RPM',
      'Vehicle speed (km/h)',
      'Calculated load (%)',
      'Intake manifold absolute pressure (kPa)',
      'Short term fuel trim—Bank 1 (%)',
      'Long term fuel trim—Bank 1 (%)',
      'Short term fuel trim—Bank 2 (%)',
      'Absolute throttle position (%)',
      'Accelerator pedal position D (%)',
      'Accelerator pedal position E (%)',
      'Commanded equivalence ratio',
    ];
    expect(headerOf(headers)).toEqual({
      time: 'Time (s)',
      rpm: 'Engine RPM',
      vehicle_speed: 'Vehicle speed (km/h)',
      engine_load: 'Calculated load (%)',
      map: 'Intake manifold absolute pressure (kPa)',
      stft_b1: 'Short term fuel trim—Bank 1 (%)',
      ltft_b1: 'Long term fuel trim—Bank 1 (%)',
      stft_b2: 'Short term fuel trim—Bank 2 (%)',
      throttle_pos: 'Absolute throttle position (%)',
      pedal_pos: 'Accelerator pedal position D (%)',
      lambda_cmd: 'Commanded equivalence ratio',
    });
  });

  it('reads abbreviations, bank suffixes and units in brackets or as a last word', () => {
    const mapping = mapHeaders([
      'Time',
      'RPM',
      'ECT',
      'IAT [°F]',
      'Boost psi',
      'STFT1',
      'LTFT B1',
      'STFT B2 (%)',
      'Lambda',
      'AFR Target',
      'KR',
      'Gear',
    ]);
    const c = mapping.channels;
    expect(c.coolant_temp?.header).toBe('ECT');
    expect(c.intake_air_temp?.unitText).toBe('°F');
    expect(c.map).toMatchObject({ header: 'Boost psi', unitText: 'psi', gauge: true });
    expect(c.stft_b1?.header).toBe('STFT1');
    expect(c.ltft_b1?.header).toBe('LTFT B1');
    expect(c.stft_b2?.header).toBe('STFT B2 (%)');
    expect(c.lambda_meas).toMatchObject({ header: 'Lambda', lambdaUnit: 'lambda' });
    expect(c.lambda_cmd).toMatchObject({ header: 'AFR Target', lambdaUnit: 'afr' });
    expect(c.knock_retard?.header).toBe('KR');
    expect(c.gear?.header).toBe('Gear');
    expect(mapping.unmapped).toEqual([]);
  });

  it('reads "MAP (psi)" as absolute and "Vehicle Speed (mph)" in mph', () => {
    const c = mapHeaders([
      'Time',
      'MAP (psi)',
      'Vehicle Speed (mph)',
      'Engine Speed (rpm)',
    ]).channels;
    expect(c.map).toMatchObject({ unitText: 'psi', gauge: false });
    expect(c.vehicle_speed?.unitText).toBe('mph');
    expect(c.rpm?.header).toBe('Engine Speed (rpm)');
  });

  it('lets overrides win, including afr_* aliases, and rejects unknown names plainly', () => {
    const mapping = mapHeaders(['t', 'Engine RPM', 'WB1', 'Lambda'], {
      time: 't',
      afr_meas: 'WB1',
    });
    expect(mapping.channels.lambda_meas).toMatchObject({ header: 'WB1', lambdaUnit: 'afr' });
    expect(mapping.unmapped).toEqual(['Lambda']);
    expect(() => mapHeaders(['a', 'b'], { speedo: 'a' })).toThrow(DomainError);
    expect(() => mapHeaders(['a', 'b'], { rpm: 'c' })).toThrow(/no column "c"/);
  });
});

describe('mapHeaders: units in script-style names and stated units', () => {
  it('reads a unit written as a snake_case, camelCase or dotted suffix', () => {
    const c = mapHeaders([
      'elapsed_ms',
      'coolant_c',
      'oil_temp_f',
      'fuel_press_psig',
      'veh_spd_kph',
      'airflow_lbmin',
      'stftB1Pct',
      'rpm.min',
      'mapPsia',
    ]).channels;
    expect(c.time).toMatchObject({ header: 'elapsed_ms', unitText: 'ms' });
    expect(c.coolant_temp).toMatchObject({ header: 'coolant_c', unitText: 'c' });
    expect(c.oil_temp).toMatchObject({ header: 'oil_temp_f', unitText: 'f' });
    expect(c.fuel_pressure).toMatchObject({ header: 'fuel_press_psig', unitText: 'psig' });
    expect(c.vehicle_speed).toMatchObject({ header: 'veh_spd_kph', unitText: 'kph' });
    expect(c.maf).toMatchObject({ header: 'airflow_lbmin', unitText: 'lbmin' });
    expect(c.stft_b1).toMatchObject({ header: 'stftB1Pct', unitText: 'Pct' });
    expect(c.rpm).toMatchObject({ header: 'rpm.min', unitText: 'min' });
    expect(c.map).toMatchObject({ header: 'mapPsia', unitText: 'Psia' });
  });

  it('keeps a spaced single letter as part of the name ("Accelerator pedal position F" is no °F)', () => {
    const c = mapHeaders(['Time', 'Accelerator pedal position F']).channels;
    expect(c.pedal_pos?.unitText).toBeNull();
  });

  it('reads the unit of a column named with --map from its suffix', () => {
    const c = mapHeaders(['t_s', 'press_psig'], { time: 't_s', map: 'press_psig' }).channels;
    expect(c.map).toMatchObject({ unitText: 'psig' });
  });

  it('knows wideband, boost/vacuum, knock-average, device-time, baro and ethanol words', () => {
    const headerOf = (headers: string[]) =>
      Object.fromEntries(Object.entries(mapHeaders(headers).channels).map(([k, m]) => [k, m.header]));
    expect(
      headerOf([
        'Device Time',
        'Boost/Vacuum (psi)',
        'Knock Retard Cyl Avg',
        'Lambda Sensor 1',
        'Barometric Pressure (kPa)',
        'Flex Fuel Content (%)',
      ]),
    ).toEqual({
      time: 'Device Time',
      map: 'Boost/Vacuum (psi)',
      knock_retard: 'Knock Retard Cyl Avg',
      lambda_meas: 'Lambda Sensor 1',
      baro: 'Barometric Pressure (kPa)',
      ethanol_pct: 'Flex Fuel Content (%)',
    });
    for (const wideband of ['AFR wb', 'Lambda wideband', 'O2 WB'])
      expect(headerOf(['Time', wideband]).lambda_meas).toBe(wideband);
    expect(headerOf(['Time', 'E%']).ethanol_pct).toBe('E%');
    expect(mapHeaders(['Time', 'Boost/Vacuum (psi)']).channels.map?.gauge).toBe(true);
  });

  it('lets a stated unit overrule the header, and refuses a unit of another quantity', () => {
    const mapping = mapHeaders(['Time', 'Boost (psi)', 'AFR'], {}, { map: 'psia', afr_meas: 'lambda' });
    expect(mapping.channels.map).toMatchObject({ unitText: 'psia', unitStated: true });
    expect(mapping.channels.lambda_meas).toMatchObject({ lambdaUnit: 'lambda', unitStated: true });
    expect(() => mapHeaders(['Time', 'MAP'], {}, { map: '°F' })).toThrow(/not a unit of manifold pressure/);
    expect(() => mapHeaders(['Time', 'MAP'], {}, { maf: 'g/s' })).toThrow(/no column of this log/);
  });
});

describe('headerSignature', () => {
  it('ignores case, quotes and spacing but not the columns or their order', () => {
    const a = headerSignature(['Time (s)', 'Engine RPM']);
    expect(headerSignature(['"time (s)"', '  engine   rpm '])).toBe(a);
    expect(headerSignature(['Engine RPM', 'Time (s)'])).not.toBe(a);
    expect(a).toMatch(/^hdr1-[0-9a-f]{16}$/);
  });
});
