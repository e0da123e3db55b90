import { closeSync, fstatSync, openSync, readSync } from 'node:fs';
import { CSV_HEAD_BYTES, type CsvSource } from '@revloop/domain/datalog';

/** Read size: large enough that system calls cost nothing, small enough that a 90 MB log never sits in memory. */
const PIECE_BYTES = 1 << 20;

/**
 * Reads a log file in pieces (see CsvSource) with `read`, closing it after. A file that cannot be opened throws
 * the fs error (ENOENT, EISDIR…), or what `openError` makes of it.
 */
export function readCsvFile<T>(
  path: string,
  read: (log: CsvSource) => T,
  openError: (error: unknown) => unknown = (error) => error,
): T {
  let log;
  try {
    log = openCsvFile(path);
  } catch (error) {
    throw openError(error);
  }
  try {
    return read(log);
  } finally {
    log.close();
  }
}

function openCsvFile(path: string): CsvSource & { close: () => void } {
  const fd = openSync(path, 'r');
  try {
    const byteLength = fstatSync(fd).size;
    // Plain Uint8Arrays, not Buffers: the parser's byte loads then see one array type.
    const head = new Uint8Array(Math.min(byteLength, CSV_HEAD_BYTES));
    const headBytes = readSync(fd, head, 0, head.length, 0);
    return {
      head: head.subarray(0, headBytes),
      byteLength,
      *chunks() {
        const piece = new Uint8Array(PIECE_BYTES);
        for (let position = 0; ;) {
          const read = readSync(fd, piece, 0, PIECE_BYTES, position);
          if (read === 0) return;
          position += read;
          yield piece.subarray(0, read);
        }
      },
      close: () => closeSync(fd),
    };
  } catch (error) {
    closeSync(fd);
    throw error;
  }
}
