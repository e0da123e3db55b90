// Worker entry in plain JavaScript: tsImport loads the TypeScript job with a loader scoped to it, so this works
// whether the parent runs under tsx (the API) or under vitest, and never registers tsx twice.
import { tsImport } from 'tsx/esm/api';

await tsImport('./analyze-file.job.ts', import.meta.url);
