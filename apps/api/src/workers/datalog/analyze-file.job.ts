import { parentPort } from 'node:worker_threads';
import { isDomainError } from '@revloop/domain';
import { analyzeDatalog } from '@revloop/domain/datalog';
import type { AnalyzeJob, AnalyzeMessage } from './analyze-file';
import { readCsvFile } from './csv-file';

const port = parentPort;
if (port === null) throw new Error('analyze-file.job runs only as a worker thread.');
const post = (message: AnalyzeMessage) => port.postMessage(message);

// Jobs arrive as messages, not as workerData: the thread may have been started before there was a log. The parent
// keeps a thread for the next log after a small one and ends it after a large one (analyze-file.ts).
port.on('message', ({ filePath, options }: AnalyzeJob) => {
  try {
    const report = readCsvFile(filePath, (log) =>
      analyzeDatalog(log, {
        ...options,
        onProgress: (fraction) => post({ type: 'progress', fraction }),
      }),
    );
    post({ type: 'done', report });
  } catch (error) {
    post({
      type: 'error',
      code: isDomainError(error) ? error.code : null,
      message: error instanceof Error ? error.message : String(error),
    });
  }
});
