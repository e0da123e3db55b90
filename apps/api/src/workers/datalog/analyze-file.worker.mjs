// Worker entry in plain JavaScript: it runs the job compiled by apps/api/scripts/build-node.mjs (built here first when a
// source is newer), so no TypeScript is compiled when a log arrives, whether the parent runs under tsx or vitest.
import { pathToFileURL } from 'node:url';
import { builtPath, ensureBuilt } from '../../../scripts/build-node.mjs';

await ensureBuilt();
await import(pathToFileURL(builtPath('analyze-file.job')).href);
