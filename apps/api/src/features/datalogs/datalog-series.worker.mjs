// Worker entry in plain JavaScript, like workers/datalog: tsImport loads the TypeScript job with a loader scoped to it.
import { tsImport } from 'tsx/esm/api';

await tsImport('./datalog-series.job.ts', import.meta.url);
