/**
 * A vehicle for tests that open jobs. Its VIN is the 49 CFR 565 check-digit example in REFERENCES.md
 * (1M8GDM9AXKP042788, check digit X) [STD/3P]; the other numbers are an invented car.
 */
export const TEST_VEHICLE = {
  vin: '1M8GDM9AXKP042788',
  modelYear: 1989,
  description: 'Test hatchback, 2.0 turbo I4',
  engine: { displacementL: 2, cylinders: 4, aspiration: 'turbocharged', family: '2.0 turbo I4' },
  transmission: { type: 'manual', gearRatios: [3.36, 2.09, 1.47, 1.1, 0.87, 0.71] },
  finalDrive: 3.47,
  tyreSize: '245/40R20',
  curbMassKg: 1400,
  fuel: { type: 'gasoline', octane: { scale: 'AKI', rating: 93 }, ethanolPct: 10 },
  modifications: { parts: ['intake'], notes: '' },
  revLimitRpm: 6800,
};
