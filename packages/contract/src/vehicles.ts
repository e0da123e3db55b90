import { VIN_REGION_LABELS, type CircumferenceSource, type SpeedTableRow, type VehicleInput, type VinRegion } from '@revloop/domain/vehicles';
import { z } from 'zod';
import { itemOf, listOf, timestamp } from './envelope';

/** A finding about a read's image size against the sizes the shop expects for the engine family. */
export const readPlausibilitySchema = z.object({
  status: z.enum(['ok', 'unexpected_size', 'unknown_family']),
  message: z.string(),
  expectedBytes: z.array(z.number().int()),
});

const fileEvent = z.object({
  fileId: z.string(),
  module: z.enum(['ECM', 'TCM', 'other']),
  name: z.string(),
  imageBytes: z.number().int(),
  crc32: z.number().int(),
  by: z.string().nullable(),
});

/** One event in a vehicle's history, newest first; every event belongs to a job. */
export const vehicleHistoryEventSchema = z.discriminatedUnion('kind', [
  fileEvent.extend({ kind: z.literal('read'), plausibility: readPlausibilitySchema }),
  fileEvent.extend({ kind: z.literal('revision'), revisionNumber: z.number().int().nullable(), notes: z.string() }),
  /** A re-read; `proves` names the revision whose image it matches byte for byte (by CRC-32 and size), if any. */
  fileEvent.extend({ kind: z.literal('re_read'), proves: z.object({ fileId: z.string(), revisionNumber: z.number().int().nullable() }).nullable() }),
  z.object({
    kind: z.literal('log'),
    datalogId: z.string(),
    name: z.string(),
    round: z.number().int(),
    status: z.enum(['processing', 'ready', 'failed']),
    checks: z.array(z.object({ id: z.string(), status: z.enum(['pass', 'warn', 'fail']), message: z.string() })),
  }),
]).and(z.object({ at: z.string(), job: z.object({ id: z.string(), number: z.number().int() }) }));
export type VehicleHistoryEvent = z.infer<typeof vehicleHistoryEventSchema>;

export const vehicleHistoryResponseSchema = z.object({ data: z.array(vehicleHistoryEventSchema) });
export type VehicleHistoryResponse = z.infer<typeof vehicleHistoryResponseSchema>;

const VIN_REGIONS = Object.keys(VIN_REGION_LABELS) as [VinRegion, ...VinRegion[]];

/** Road speed in one gear. */
export const speedTableRowSchema = z.object({
  gear: z.number().int(),
  ratio: z.number(),
  kmhPer1000Rpm: z.number(),
  kmhAtRevLimit: z.number(),
}) satisfies z.ZodType<SpeedTableRow>;

/** What the vehicle's numbers mean, computed by the server from the domain code; null when the spec cannot be read. */
export const vehicleDerivedSchema = z.object({
  tyreDiameterMm: z.number(),
  /** Unloaded, from the tyre size. */
  tyreCircumferenceMm: z.number(),
  /** What the speeds and the datalog analysis use: measured when given, else the tyre size's. */
  rollingCircumferenceMm: z.number(),
  circumferenceSource: z.enum(['measured', 'tyre_size']) satisfies z.ZodType<CircumferenceSource>,
  stoichAfr: z.number(),
  speeds: z.array(speedTableRowSchema),
});
export type VehicleDerived = z.infer<typeof vehicleDerivedSchema>;

/** A vehicle with what its numbers mean (`GET /api/vehicles`, `GET /api/vehicles/:id`, and the answers to creating and editing one). */
export const vehicleSchema = z.object({
  id: z.string(),
  owner: z.object({ id: z.string(), name: z.string(), email: z.string() }),
  dealerId: z.string().nullable(),
  vin: z.string(),
  vinRegion: z.enum(VIN_REGIONS).nullable(),
  /** Notes on the VIN a user should see, e.g. that VINs from its region encode no model year. */
  vinWarnings: z.array(z.string()),
  modelYear: z.number().int(),
  description: z.string(),
  /** The vehicle as entered (stored as checked on the way in, so it is not checked again on every read). */
  spec: z.custom<VehicleInput>((value) => typeof value === 'object' && value !== null),
  derived: vehicleDerivedSchema.nullable(),
  createdAt: timestamp,
});
export type Vehicle = z.infer<typeof vehicleSchema>;

export const vehicleResponseSchema = itemOf(vehicleSchema);
export const vehiclesResponseSchema = listOf(vehicleSchema);
export type VehiclesResponse = z.infer<typeof vehiclesResponseSchema>;
