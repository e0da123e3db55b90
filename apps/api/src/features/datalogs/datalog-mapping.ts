import fsp from 'node:fs/promises';
import { findDatalogMapping, type Db } from '@revloop/db';
import {
  datalogMappingInputSchema,
  detectCsvLayout,
  mapHeaders,
  type AnalyzeOptions,
  type DatalogMappingInput,
} from '@revloop/domain/datalog';

/** What the datalogs.mapping column holds. */
export interface StoredMapping {
  headers: string[];
  /** Channel → header; '' = not logged. Empty when the synonyms' proposal was used as is. */
  overrides: Record<string, string>;
  /** Channel → unit the user stated (absent in rows written before units could be stated). */
  units?: Record<string, string>;
  afrScale?: DatalogMappingInput['afrScale'];
  trimAxis?: DatalogMappingInput['trimAxis'];
}

/** The analysis options a stored mapping decides. */
export function mappingOptions(mapping: StoredMapping): Pick<AnalyzeOptions, 'map' | 'units' | 'afrScale' | 'trimAxis'> {
  return {
    map: mapping.overrides,
    units: mapping.units ?? {},
    ...(mapping.afrScale && { afrScale: mapping.afrScale }),
    ...(mapping.trimAxis && { trimAxis: mapping.trimAxis }),
  };
}

/** A shop's remembered mapping: the full input since units could be stated, a bare channel → header object before. */
function parseRemembered(json: string): DatalogMappingInput {
  const raw: unknown = JSON.parse(json);
  const full = datalogMappingInputSchema.safeParse(raw);
  if (full.success) return full.data;
  const legacy = datalogMappingInputSchema.shape.channels.safeParse(raw);
  return { channels: legacy.success ? legacy.data : {} };
}

/** Enough of the file to find the header row, whatever the logger's preamble (see detectCsvLayout). */
const HEAD_BYTES = 256 * 1024;

/** Reads the column headers from the start of a log; bad input (binary, empty, header only) throws invalid_datalog. */
export async function readLogHeaders(filePath: string): Promise<string[]> {
  const handle = await fsp.open(filePath, 'r');
  try {
    const buffer = Buffer.alloc(HEAD_BYTES);
    const { bytesRead } = await handle.read(buffer, 0, HEAD_BYTES, 0);
    return detectCsvLayout(new Uint8Array(buffer.buffer, buffer.byteOffset, bytesRead)).headers;
  } finally {
    await handle.close();
  }
}

/** The shop's remembered mapping for this header set, then the uploader's own choices, checked against the headers. */
export async function resolveMapping(
  db: Db,
  shopId: string,
  headers: string[],
  signature: string,
  own: Partial<DatalogMappingInput>,
): Promise<StoredMapping> {
  const found = await findDatalogMapping(db, shopId, signature);
  const remembered = found ? parseRemembered(found.mapping) : undefined;
  const mapping: StoredMapping = {
    headers,
    overrides: { ...remembered?.channels, ...own.channels },
    units: { ...remembered?.units, ...own.units },
  };
  const afrScale = own.afrScale ?? remembered?.afrScale;
  const trimAxis = own.trimAxis ?? remembered?.trimAxis;
  if (afrScale) mapping.afrScale = afrScale;
  if (trimAxis) mapping.trimAxis = trimAxis;
  mapHeaders(headers, mapping.overrides, mapping.units);
  return mapping;
}
