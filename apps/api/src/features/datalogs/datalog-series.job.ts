import { parentPort, workerData } from 'node:worker_threads';
import { isDomainError } from '@revloop/domain';
import { readDatalog } from '@revloop/domain/datalog';
import { readCsvFile } from '../../workers/datalog/csv-file';
import type { SeriesJob, SeriesMessage } from './datalog-series';

const port = parentPort;
if (port === null) throw new Error('datalog-series.job runs only as a worker thread.');
const { filePath, options } = workerData as SeriesJob;

try {
  const series = readCsvFile(filePath, (log) => readDatalog(log, options));
  const columns = { time: series.time, ...series.channels };
  const message: SeriesMessage = { type: 'done', rows: series.rows, columns };
  // Transferred, not copied: a 1M-row log is tens of MB of typed arrays.
  port.postMessage(
    message,
    Object.values(columns).map((c) => c.buffer as ArrayBuffer),
  );
} catch (error) {
  const message: SeriesMessage = {
    type: 'error',
    code: isDomainError(error) ? error.code : null,
    message: error instanceof Error ? error.message : String(error),
  };
  port.postMessage(message);
}
