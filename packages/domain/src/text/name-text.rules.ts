import { z } from 'zod';

/**
 * Characters a name must not hold: C0 and C1 controls and DEL (NUL, CR/LF… break headers, logs and CSV rows),
 * the line and paragraph separators U+2028/U+2029, and the bidirectional marks, embeddings, overrides and
 * isolates (U+061C, U+200E/U+200F, U+202A–U+202E, U+2066–U+2069) that make "evil\u202Etxt.exe" display as
 * "evilexe.txt" (Unicode Technical Standard #39 / CVE-2021-42574 "Trojan Source" [3P]).
 */
// eslint-disable-next-line no-control-regex -- matching control characters is the point
const UNSAFE_NAME_CHARACTER = /[\u0000-\u001f\u007f-\u009f\u061c\u200e\u200f\u2028-\u202e\u2066-\u2069]/u;

export const UNSAFE_NAME_MESSAGE = 'Names must not contain control characters (such as line breaks) or text-direction marks.';

/** True when `text` holds a control or bidirectional-formatting character. */
export const hasUnsafeNameCharacter = (text: string): boolean => UNSAFE_NAME_CHARACTER.test(text);

/** The one schema for a name a person types (people, shops, dealers, packages, vehicles): trimmed, bounded, clean. */
export const nameSchema = (min: number, max: number, emptyMessage?: string) =>
  z
    .string()
    .trim()
    .min(min, emptyMessage)
    .max(max)
    .refine((text) => !hasUnsafeNameCharacter(text), UNSAFE_NAME_MESSAGE);
