// `npm run -s analyze -- FILE.csv [--fuel …] [--map channel=header …] [--unit channel=unit …] [--afr-scale …]
// [--trim-axis …] [--vehicle vehicle.json]`: report JSON on stdout.
// Exit 0 on success, 2 with one line on stderr for unreadable input or bad options, 1 for a bug.
import { readFileSync } from 'node:fs';
import { parseArgs } from 'node:util';
import {
  AFR_SCALES,
  analyzeDatalog,
  type AfrScale,
  type AnalyzeOptions,
} from '@revloop/domain/datalog';
import { isDomainError } from '@revloop/domain';
import { parseFuelOption } from '@revloop/domain/vehicles';
import { readCsvFile } from '../workers/datalog/csv-file';

const USAGE =
  'usage: analyze FILE.csv [--fuel gasoline|diesel|e85|e<NN>|stoich=<AFR>] [--map <channel>=<header> ...] [--unit <channel>=<unit> ...] [--afr-scale fuel|gasoline] [--trim-axis map|maf] [--vehicle vehicle.json]';
const TRIM_AXES = ['map', 'maf'] as const;

class UsageError extends Error {}

function readInput(path: string, what: string): Buffer {
  try {
    return readFileSync(path);
  } catch (error) {
    throw unreadable(error, path, what);
  }
}

function unreadable(error: unknown, path: string, what: string): UsageError {
  const code = (error as NodeJS.ErrnoException).code;
  const reason =
    code === 'ENOENT'
      ? 'no such file'
      : code === 'EISDIR'
        ? 'it is a folder'
        : code === 'EACCES'
          ? 'permission denied'
          : String(code ?? error);
  return new UsageError(`cannot read ${what} "${path}": ${reason}`);
}

function parsePairs(flag: string, what: string, pairs: string[]): Record<string, string> {
  return Object.fromEntries(
    pairs.map((pair) => {
      const at = pair.indexOf('=');
      if (at <= 0) throw new UsageError(`--${flag} needs <channel>=<${what}>, got "${pair}"`);
      return [pair.slice(0, at).trim(), pair.slice(at + 1).trim()];
    }),
  );
}

function oneOf<T extends string>(flag: string, value: string, allowed: readonly T[]): T {
  if (!(allowed as readonly string[]).includes(value))
    throw new UsageError(`--${flag} is ${allowed.join(' or ')}, got "${value}"`);
  return value as T;
}

async function parseVehicle(path: string): Promise<AnalyzeOptions['vehicle']> {
  let json: unknown;
  try {
    json = JSON.parse(readInput(path, 'vehicle file').toString('utf8'));
  } catch (error) {
    if (error instanceof UsageError) throw error;
    throw new UsageError(`vehicle file "${path}" is not valid JSON`);
  }
  const { parseVehicleJson } = await import('./vehicle-file');
  const vehicle = parseVehicleJson(json);
  if (vehicle === undefined) {
    throw new UsageError(
      `vehicle file "${path}" needs { gearRatios: number[], finalDrive: number, tyreSize: "245/40R20" }`,
    );
  }
  return vehicle;
}

async function main(argv: string[]): Promise<number> {
  try {
    const { values, positionals } = parseArgs({
      args: argv,
      allowPositionals: true,
      options: {
        fuel: { type: 'string' },
        map: { type: 'string', multiple: true },
        unit: { type: 'string', multiple: true },
        'afr-scale': { type: 'string' },
        'trim-axis': { type: 'string' },
        vehicle: { type: 'string' },
      },
    });
    const [file, ...extra] = positionals;
    if (file === undefined || extra.length > 0) throw new UsageError(USAGE);
    const options: AnalyzeOptions = {
      map: parsePairs('map', 'header', values.map ?? []),
      units: parsePairs('unit', 'unit', values.unit ?? []),
    };
    const afrScale = values['afr-scale'];
    if (afrScale !== undefined) options.afrScale = oneOf<AfrScale>('afr-scale', afrScale, AFR_SCALES);
    const trimAxis = values['trim-axis'];
    if (trimAxis !== undefined) options.trimAxis = oneOf('trim-axis', trimAxis, TRIM_AXES);
    if (values.fuel !== undefined) options.fuel = parseFuelOption(values.fuel);
    if (values.vehicle !== undefined) options.vehicle = await parseVehicle(values.vehicle);
    // Read in pieces, so a 90 MB log never sits in memory whole.
    const report = readCsvFile(
      file,
      (log) => analyzeDatalog(log, options),
      (error) => unreadable(error, file, 'log'),
    );
    process.stdout.write(`${JSON.stringify(report, null, 2)}\n`);
    return 0;
  } catch (error) {
    const known =
      error instanceof UsageError ||
      isDomainError(error) ||
      (error as { code?: string }).code?.startsWith('ERR_PARSE_ARGS');
    if (!known) throw error;
    process.stderr.write(`analyze: ${(error as Error).message.replace(/\s*\n\s*/g, ' ')}\n`);
    return 2;
  }
}

process.exitCode = await main(process.argv.slice(2));
