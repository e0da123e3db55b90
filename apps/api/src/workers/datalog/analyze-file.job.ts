import { readFile } from 'node:fs/promises';
import { parentPort, workerData } from 'node:worker_threads';
import { isDomainError } from '@revloop/domain';
import { analyzeDatalog } from '@revloop/domain/datalog';
import type { AnalyzeJob, AnalyzeMessage } from './analyze-file';

const port = parentPort;
if (port === null) throw new Error('analyze-file.job runs only as a worker thread.');
const post = (message: AnalyzeMessage) => port.postMessage(message);
const { filePath, options } = workerData as AnalyzeJob;

try {
  const bytes = await readFile(filePath);
  const report = analyzeDatalog(new Uint8Array(bytes.buffer, bytes.byteOffset, bytes.byteLength), {
    ...options,
    onProgress: (fraction) => post({ type: 'progress', fraction }),
  });
  post({ type: 'done', report });
} catch (error) {
  post({
    type: 'error',
    code: isDomainError(error) ? error.code : null,
    message: error instanceof Error ? error.message : String(error),
  });
}
