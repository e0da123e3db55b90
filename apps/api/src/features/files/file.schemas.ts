import { z } from 'zod';

// The upload fields and the diff query are the contract's; these two queries only the API reads.
export { fileDiffQuerySchema as diffQuerySchema, uploadJobFileFieldsSchema as uploadFieldsSchema } from '@revloop/contract';

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
