// Worker entry in plain JavaScript, like workers/datalog: it runs the job compiled by apps/api/scripts/build-node.mjs.
import { pathToFileURL } from 'node:url';
import { builtPath, ensureBuilt } from '../../../scripts/build-node.mjs';

await ensureBuilt();
await import(pathToFileURL(builtPath('datalog-series.job')).href);
