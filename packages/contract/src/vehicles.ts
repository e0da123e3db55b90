import { z } from 'zod';

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
