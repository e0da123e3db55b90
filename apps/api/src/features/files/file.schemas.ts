import type { CalibrationFileKind, CalibrationModule } from '@revloop/db';
import { z } from 'zod';

export const MODULES = ['ECM', 'TCM', 'other'] as const satisfies readonly CalibrationModule[];
export const KINDS = ['read', 'revision', 're_read'] as const satisfies readonly CalibrationFileKind[];

export const uploadFieldsSchema = z.object({
  module: z.enum(MODULES, 'Choose the module: ECM, TCM or other.'),
  // "re-read" is how people write it; the API stores re_read.
  kind: z.preprocess((v) => (v === 're-read' ? 're_read' : v), z.enum(KINDS, 'Choose the kind: read, revision or re-read.')),
  notes: z.string().trim().max(2000, 'Keep the notes under 2000 characters.').default(''),
});

export const diffQuerySchema = z.object({
  gap: z.coerce.number().int().min(0).max(4096).default(16),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(200).default(50),
});

const ADDRESS = '(0x[0-9a-f]+|\\d+)';
export const hexQuerySchema = z.object({
  range: z
    .string()
    .trim()
    .regex(new RegExp(`^${ADDRESS}-${ADDRESS}$`, 'i'), 'Give the range as start-end in decimal or 0x hex, e.g. 0x1000-0x1040.')
    .transform((v) => v.split('-').map(Number) as [number, number])
    .refine(([start, end]) => end > start, 'The range must end after it starts.'),
  width: z.coerce.number().int().min(4).max(64).default(16),
});

export const linkQuerySchema = z.object({
  shop: z.string().min(1).max(100),
  exp: z.coerce.number().int().positive(),
  sig: z.string().min(1).max(200),
});
