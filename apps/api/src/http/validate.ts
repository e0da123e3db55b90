import type { z } from 'zod';

/** Parses input at the edge; a ZodError becomes a 400 with the first problem in plain words. */
export const parseInput = <S extends z.ZodType>(schema: S, input: unknown): z.infer<S> => schema.parse(input);
