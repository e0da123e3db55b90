import { randomUUID } from 'node:crypto';

/** Row ids are random UUIDs: they reveal neither order nor count. */
export const newId = (): string => randomUUID();
export const nowIso = (date: Date = new Date()): string => date.toISOString();
