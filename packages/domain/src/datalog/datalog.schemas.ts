import { z } from 'zod';
import { CANONICAL_CHANNELS } from './channels';

/** `--vehicle vehicle.json` and the API's vehicle facts for gear detection. */
export const datalogVehicleSchema = z.object({
  gearRatios: z.array(z.number().positive()).min(1),
  finalDrive: z.number().positive(),
  tyreSize: z.string().min(1),
  rollingCircumferenceMm: z.number().positive().nullish(),
});

export const logRequestSchema = z.object({
  channels: z.array(z.enum(CANONICAL_CHANNELS)),
  warmupMinutes: z.number().min(0).max(60),
  wotGears: z.number().int().min(1).max(10),
  notes: z.string().max(2000),
});

const channelPairs = z.record(z.string().min(1).max(40), z.string().max(200));

/**
 * A confirmed column mapping (the mapping dialog, the upload form): channel → header ('' = not logged), channel →
 * stated unit, the AFR columns' scale and the trim grid's load axis. The shop remembers it per header set.
 */
export const datalogMappingInputSchema = z.object({
  channels: channelPairs,
  units: channelPairs.optional(),
  afrScale: z.enum(['fuel', 'gasoline']).optional(),
  trimAxis: z.enum(['map', 'maf']).optional(),
});
export type DatalogMappingInput = z.infer<typeof datalogMappingInputSchema>;
