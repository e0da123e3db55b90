import { z } from 'zod';
import { isDomainError } from '../errors';
import type { FuelSpec } from './fuel';
import { parseTyreSize } from './tyre';
import { nameSchema } from '../text/name-text.rules';
import { checkVin, vinNeedsConfirmation } from './vin';

export const ASPIRATIONS = [
  'naturally_aspirated',
  'turbocharged',
  'supercharged',
  'twin_charged',
] as const;
export const ASPIRATION_LABELS: Record<(typeof ASPIRATIONS)[number], string> = {
  naturally_aspirated: 'Naturally aspirated',
  turbocharged: 'Turbocharged',
  supercharged: 'Supercharged',
  twin_charged: 'Turbo + supercharged',
};

export const TRANSMISSION_TYPES = ['manual', 'automatic', 'dct', 'cvt'] as const;
export const TRANSMISSION_LABELS: Record<(typeof TRANSMISSION_TYPES)[number], string> = {
  manual: 'Manual',
  automatic: 'Automatic',
  dct: 'Dual-clutch',
  cvt: 'CVT',
};

export const FUEL_TYPES = ['gasoline', 'diesel', 'methanol'] as const;
export const OCTANE_SCALES = ['RON', 'AKI'] as const;

/** Parts a shop asks about before it calibrates; anything else goes in the notes. */
export const COMMON_MODIFICATIONS = [
  { id: 'intake', label: 'Intake / air filter' },
  { id: 'exhaust', label: 'Exhaust (cat-back)' },
  { id: 'downpipe', label: 'Downpipe' },
  { id: 'headers', label: 'Headers / exhaust manifold' },
  { id: 'high_flow_catalyst', label: 'High-flow catalyst' },
  { id: 'intercooler', label: 'Intercooler' },
  { id: 'charge_pipes', label: 'Charge pipes' },
  { id: 'turbo_upgrade', label: 'Turbo upgrade' },
  { id: 'supercharger', label: 'Supercharger' },
  { id: 'injectors', label: 'Injectors' },
  { id: 'fuel_pump', label: 'Fuel pump' },
  { id: 'flex_fuel_sensor', label: 'Ethanol content sensor' },
  { id: 'camshafts', label: 'Camshafts' },
  { id: 'throttle_body', label: 'Throttle body' },
  { id: 'intake_manifold', label: 'Intake manifold' },
  { id: 'map_sensor', label: 'Higher-range MAP sensor' },
  { id: 'clutch', label: 'Clutch' },
  { id: 'limited_slip_diff', label: 'Limited-slip differential' },
  { id: 'final_drive', label: 'Final drive change' },
] as const;
export type ModificationId = (typeof COMMON_MODIFICATIONS)[number]['id'];
const MODIFICATION_IDS = COMMON_MODIFICATIONS.map((m) => m.id) as [
  ModificationId,
  ...ModificationId[],
];

/** Oldest year whose VINs follow the 17-character 49 CFR 565 scheme. */
export const FIRST_VIN_MODEL_YEAR = 1981;

const vinSchema = z
  .string()
  .trim()
  .transform((value, ctx) => {
    const { vin, errors } = checkVin(value);
    for (const message of errors) ctx.addIssue({ code: 'custom', message });
    return errors.length === 0 ? vin : z.NEVER;
  });

/** A tyre size, normalised to its plain designation (e.g. "P245/40ZR20 95Y" → "245/40R20"). */
export const tyreSizeSchema = z
  .string()
  .trim()
  .transform((value, ctx) => {
    try {
      return parseTyreSize(value).code;
    } catch (error) {
      ctx.addIssue({
        code: 'custom',
        message: isDomainError(error) ? error.message : 'Not a tyre size.',
      });
      return z.NEVER;
    }
  });

/** Bounds of a measured rolling circumference: a 10-inch wheel's smallest tyre up to a 37-inch off-road tyre. */
export const ROLLING_CIRCUMFERENCE_RANGE_MM = [1000, 3000] as const;
/** A loaded tyre rolls a few percent short of its size; a bigger gap means a slip of the tape or the wrong size. */
export const ROLLING_CIRCUMFERENCE_MAX_DEVIATION = 0.1;

const gearRatioSchema = z
  .number()
  .min(0.3, 'A gear ratio is at least 0.30.')
  .max(7, 'A gear ratio is at most 7.00.');

export const vehicleInputSchema = z
  .object({
    vin: vinSchema,
    /** Set when the user confirms a North American VIN whose check digit does not match. */
    vinCheckDigitOverride: z.boolean().default(false),
    modelYear: z
      .number()
      .int('Model year is a whole year.')
      .min(FIRST_VIN_MODEL_YEAR, `Model year is ${FIRST_VIN_MODEL_YEAR} or later.`)
      .max(new Date().getFullYear() + 2, 'Model year is at most two years ahead.'),
    description: nameSchema(1, 200, 'Describe the vehicle, e.g. make, model and trim.'),
    engine: z.object({
      displacementL: z
        .number()
        .min(0.5, 'Displacement is at least 0.5 L.')
        .max(10, 'Displacement is at most 10 L.'),
      cylinders: z.number().int().min(1).max(16),
      aspiration: z.enum(ASPIRATIONS),
      family: nameSchema(1, 80, 'Name the engine family, e.g. "2.0 turbo I4".'),
    }),
    transmission: z.object({
      type: z.enum(TRANSMISSION_TYPES),
      /** First gear first; a CVT has none. */
      gearRatios: z.array(gearRatioSchema).max(10, 'At most 10 forward gears.'),
    }),
    finalDrive: z
      .number()
      .min(1.5, 'Final drive ratio is at least 1.50.')
      .max(7, 'Final drive ratio is at most 7.00.'),
    tyreSize: tyreSizeSchema,
    /** Distance covered per wheel turn, measured on the car; absent or null = computed from the tyre size. */
    rollingCircumferenceMm: z
      .number()
      .min(
        ROLLING_CIRCUMFERENCE_RANGE_MM[0],
        `A rolling circumference is at least ${ROLLING_CIRCUMFERENCE_RANGE_MM[0]} mm.`,
      )
      .max(
        ROLLING_CIRCUMFERENCE_RANGE_MM[1],
        `A rolling circumference is at most ${ROLLING_CIRCUMFERENCE_RANGE_MM[1]} mm.`,
      )
      .nullish(),
    curbMassKg: z
      .number()
      .min(300, 'Curb mass is at least 300 kg.')
      .max(5000, 'Curb mass is at most 5000 kg.'),
    fuel: z.object({
      type: z.enum(FUEL_TYPES).default('gasoline'),
      /** Pump octane as printed: RON in most of the world, AKI ((R+M)/2) in North America. */
      octane: z
        .object({
          scale: z.enum(OCTANE_SCALES),
          rating: z.number().min(80, 'Octane is at least 80.').max(120, 'Octane is at most 120.'),
        })
        .nullable()
        .default(null),
      ethanolPct: z.number().min(0).max(100, 'Ethanol share is at most 100 %.').default(0),
    }),
    modifications: z
      .object({
        parts: z
          .array(z.enum(MODIFICATION_IDS))
          .refine((parts) => new Set(parts).size === parts.length, 'Each part once.'),
        notes: z.string().trim().max(2000).default(''),
      })
      .default({ parts: [], notes: '' }),
    revLimitRpm: z
      .number()
      .int()
      .min(1000, 'Rev limit is at least 1000 rpm.')
      .max(12000, 'Rev limit is at most 12000 rpm.'),
  })
  .superRefine((vehicle, ctx) => {
    const { type, gearRatios } = vehicle.transmission;
    if (type !== 'cvt' && gearRatios.length === 0) {
      ctx.addIssue({
        code: 'custom',
        path: ['transmission', 'gearRatios'],
        message: 'Enter the gear ratios, first gear first.',
      });
    }
    if (gearRatios.some((ratio, i) => i > 0 && ratio >= (gearRatios[i - 1] ?? Infinity))) {
      ctx.addIssue({
        code: 'custom',
        path: ['transmission', 'gearRatios'],
        message: 'Each gear ratio must be lower than the one before.',
      });
    }
    const vin = checkVin(vehicle.vin);
    if (vinNeedsConfirmation(vin) && !vehicle.vinCheckDigitOverride) {
      ctx.addIssue({
        code: 'custom',
        path: ['vin'],
        message: `${vin.warnings.join(' ')} Confirm to keep it as entered.`,
      });
    }
    const measured = vehicle.rollingCircumferenceMm;
    if (measured !== null && measured !== undefined) {
      const { code, circumferenceMm } = parseTyreSize(vehicle.tyreSize);
      const deviation = measured / circumferenceMm - 1;
      if (Math.abs(deviation) > ROLLING_CIRCUMFERENCE_MAX_DEVIATION) {
        ctx.addIssue({
          code: 'custom',
          path: ['rollingCircumferenceMm'],
          message: `${measured} mm is ${Math.abs(deviation * 100).toFixed(0)} % ${deviation < 0 ? 'below' : 'above'} the ${circumferenceMm.toFixed(0)} mm of a ${code}; a loaded tyre rolls only a few percent short. Measure again, or check the tyre size.`,
        });
      }
    }
    if (vehicle.fuel.type !== 'gasoline' && vehicle.fuel.ethanolPct > 0) {
      ctx.addIssue({
        code: 'custom',
        path: ['fuel', 'ethanolPct'],
        message: 'An ethanol share applies to gasoline blends only.',
      });
    }
  });

/** A validated vehicle as the API stores it. */
export type VehicleInput = z.infer<typeof vehicleInputSchema>;
/** What a form may submit before defaults are filled in. */
export type VehicleFormValues = z.input<typeof vehicleInputSchema>;

export function vehicleFuelSpec(vehicle: Pick<VehicleInput, 'fuel'>): FuelSpec {
  const { type, ethanolPct } = vehicle.fuel;
  if (type !== 'gasoline') return { kind: type };
  return ethanolPct > 0 ? { kind: 'ethanol_blend', ethanolPct } : { kind: 'gasoline' };
}
