import { z } from 'zod';

/** `{ data }`: one item. */
export const itemOf = <T extends z.ZodType>(item: T) => z.object({ data: item });

/** `{ data: [...], meta? }`: a list; `meta` carries the total or what the viewer may do with the list. */
export const listOf = <T extends z.ZodType>(item: T) => z.object({ data: z.array(item), meta: z.object({ total: z.number() }).optional() });

/** A list whose `meta` says more: the page, or what the viewer may do with the list. */
export const listWithMeta = <T extends z.ZodType, M extends z.ZodType>(item: T, meta: M) => z.object({ data: z.array(item), meta });

/** A user named on a row: who uploaded, who wrote, who is assigned. */
export const personRefSchema = z.object({ id: z.string(), name: z.string() });
export type PersonRef = z.infer<typeof personRefSchema>;

/** A row reached through an outer join in SQL: the name is null if the row behind it is gone. */
export const joinedRefSchema = z.object({ id: z.string(), name: z.string().nullable() });

/** ISO 8601 timestamps travel as strings; checking their form on every row would cost time on big lists. */
export const timestamp = z.string();
