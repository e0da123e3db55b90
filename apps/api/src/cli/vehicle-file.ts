// Only `--vehicle` needs zod: this module is loaded on demand (its own file in apps/api/dist/node), so the CLI
// starts without parsing and running the 580 kB of zod.
import { datalogVehicleSchema, type DatalogVehicle } from '@revloop/domain/datalog';

/** The vehicle facts in a `--vehicle` file, or undefined when they do not fit the schema. */
export function parseVehicleJson(json: unknown): DatalogVehicle | undefined {
  const parsed = datalogVehicleSchema.safeParse(json);
  return parsed.success ? parsed.data : undefined;
}
