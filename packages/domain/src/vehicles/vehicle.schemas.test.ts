import { describe, expect, it } from 'vitest';
import { stoichAfr } from './fuel';
import { type VehicleFormValues, vehicleFuelSpec, vehicleInputSchema } from './vehicle.schemas';

// Demo values for schema behaviour only; the VIN is the 49 CFR 565.15(c) Table V worked example.
const valid: VehicleFormValues = {
  vin: '1g4ah59h45g118341',
  modelYear: 2005,
  description: 'Demo sedan',
  engine: { displacementL: 2, cylinders: 4, aspiration: 'turbocharged', family: '2.0 turbo I4' },
  transmission: { type: 'manual', gearRatios: [3.36, 2.09, 1.47, 1.1, 0.87, 0.72] },
  finalDrive: 3.15,
  tyreSize: 'P245/40ZR20 95Y',
  curbMassKg: 1500,
  fuel: { octane: { scale: 'RON', rating: 98 }, ethanolPct: 10 },
  modifications: { parts: ['intake', 'downpipe'], notes: 'Aftermarket intercooler piping' },
  revLimitRpm: 6800,
};

const issuesOf = (input: unknown) =>
  vehicleInputSchema
    .safeParse(input)
    .error?.issues.map((issue) => ({ path: issue.path.join('.'), message: issue.message })) ?? [];

describe('vehicleInputSchema', () => {
  it('accepts a complete vehicle and normalises VIN and tyre size', () => {
    const vehicle = vehicleInputSchema.parse(valid);
    expect(vehicle.vin).toBe('1G4AH59H45G118341');
    expect(vehicle.tyreSize).toBe('245/40R20');
    expect(vehicle.fuel.type).toBe('gasoline');
    expect(vehicle.vinCheckDigitOverride).toBe(false);
  });

  it('refuses a malformed VIN and an unknown tyre size with plain messages', () => {
    const issues = issuesOf({ ...valid, vin: '1G4AH59H45G1834O', tyreSize: '31x10.50R15' });
    expect(issues.map((i) => i.path)).toEqual(['vin', 'vin', 'tyreSize']);
    expect(issues[0]?.message).toMatch(/17 characters/);
    expect(issues[1]?.message).toMatch(/never contains O/);
  });

  it('holds a wrong check digit until the user confirms it', () => {
    const wrongDigit = { ...valid, vin: '1G4AH59H35G118341' };
    expect(issuesOf(wrongDigit)).toEqual([
      { path: 'vin', message: expect.stringMatching(/Confirm to keep it/) },
    ]);
    expect(
      vehicleInputSchema.safeParse({ ...wrongDigit, vinCheckDigitOverride: true }).success,
    ).toBe(true);
  });

  it('keeps a VIN from outside North America without confirmation; the user gives the model year', () => {
    // synthetic ISO 3779 VIN with a European WMI and fillers, not a real vehicle [CALC]
    const vehicle = vehicleInputSchema.parse({
      ...valid,
      vin: 'WVWZZZ1KZ6W000001',
      modelYear: 2006,
    });
    expect(vehicle).toMatchObject({
      vin: 'WVWZZZ1KZ6W000001',
      modelYear: 2006,
      vinCheckDigitOverride: false,
    });
    expect(issuesOf({ ...valid, vin: 'WVWZZZ1KZ6W000001', modelYear: undefined })[0]?.path).toBe(
      'modelYear',
    );
  });

  it('takes a measured rolling circumference, or none', () => {
    expect(vehicleInputSchema.parse(valid).rollingCircumferenceMm).toBeUndefined();
    expect(
      vehicleInputSchema.parse({ ...valid, rollingCircumferenceMm: null }).rollingCircumferenceMm,
    ).toBeNull();
    // 2150 mm is 2.8 % under the 2211.7 mm of a 245/40R20 (π·704.0) [CALC]: a loaded tyre
    expect(
      vehicleInputSchema.parse({ ...valid, rollingCircumferenceMm: 2150 }).rollingCircumferenceMm,
    ).toBe(2150);
  });

  it('refuses a measured circumference that cannot belong to the tyre size', () => {
    // 1900 mm is 14 % under the 2211.7 mm of a 245/40R20 [CALC]
    expect(issuesOf({ ...valid, rollingCircumferenceMm: 1900 })).toEqual([
      {
        path: 'rollingCircumferenceMm',
        message: expect.stringMatching(/^1900 mm is 14 % below the 2212 mm of a 245\/40R20/),
      },
    ]);
    expect(issuesOf({ ...valid, rollingCircumferenceMm: 500 })[0]?.message).toMatch(
      /at least 1000 mm/,
    );
    expect(
      issuesOf({ ...valid, tyreSize: 'banana', rollingCircumferenceMm: 2150 }).map((i) => i.path),
    ).toEqual(['tyreSize']);
  });

  it('wants gear ratios, first gear first, except on a CVT', () => {
    expect(issuesOf({ ...valid, transmission: { type: 'manual', gearRatios: [] } })[0]?.path).toBe(
      'transmission.gearRatios',
    );
    expect(
      issuesOf({ ...valid, transmission: { type: 'manual', gearRatios: [0.72, 3.36] } })[0]
        ?.message,
    ).toMatch(/lower than the one before/);
    expect(
      vehicleInputSchema.safeParse({ ...valid, transmission: { type: 'cvt', gearRatios: [] } })
        .success,
    ).toBe(true);
  });

  it('refuses unknown modification parts and repeated ones', () => {
    expect(
      issuesOf({ ...valid, modifications: { parts: ['flux_capacitor'], notes: '' } })[0]?.path,
    ).toBe('modifications.parts.0');
    expect(
      issuesOf({ ...valid, modifications: { parts: ['intake', 'intake'], notes: '' } })[0]?.message,
    ).toBe('Each part once.');
  });

  it('refuses an ethanol share on diesel', () => {
    expect(issuesOf({ ...valid, fuel: { type: 'diesel', ethanolPct: 10 } })[0]?.path).toBe(
      'fuel.ethanolPct',
    );
  });
});

describe('vehicleFuelSpec', () => {
  it('maps the form fuel to a FuelSpec', () => {
    const e10 = vehicleInputSchema.parse(valid);
    expect(vehicleFuelSpec(e10)).toEqual({ kind: 'ethanol_blend', ethanolPct: 10 });
    // E10 by the REFERENCES.md blend rule → 14.10 [CALC]
    expect(stoichAfr(vehicleFuelSpec(e10))).toBeCloseTo(14.1, 2);
    expect(vehicleFuelSpec({ fuel: { ...e10.fuel, ethanolPct: 0 } })).toEqual({ kind: 'gasoline' });
    expect(vehicleFuelSpec({ fuel: { type: 'diesel', octane: null, ethanolPct: 0 } })).toEqual({
      kind: 'diesel',
    });
  });
});
