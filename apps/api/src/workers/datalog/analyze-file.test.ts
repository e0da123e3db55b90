import { execFile } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { promisify } from 'node:util';
import { afterAll, describe, expect, it } from 'vitest';
import { DomainError } from '@revloop/domain';
import { analyzeDatalog } from '@revloop/domain/datalog';
import { DEMO_VEHICLE, generateLog } from '@revloop/domain/datalog/testing';
import { analyzeFileInWorker } from './analyze-file';

const dir = mkdtempSync(join(tmpdir(), 'analyze-worker-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));
const text = generateLog({
  pulls: [{ gears: [2, 3] }],
  knock: [{ pull: 0, atFraction: 0.4, peakDeg: 3 }],
}).text;
const logPath = join(dir, 'log.csv');
writeFileSync(logPath, text);

describe('analyzeFileInWorker', () => {
  it('returns the same report as the in-thread analysis and posts progress up to 1', async () => {
    const progress: number[] = [];
    const report = await analyzeFileInWorker(logPath, { vehicle: DEMO_VEHICLE }, (f) =>
      progress.push(f),
    );
    expect(report).toEqual(
      analyzeDatalog(new TextEncoder().encode(text), { vehicle: DEMO_VEHICLE }),
    );
    expect(progress.at(-1)).toBe(1);
  });

  it('rejects bad input with the DomainError code intact', async () => {
    const empty = join(dir, 'empty.csv');
    writeFileSync(empty, '');
    const error = await analyzeFileInWorker(empty).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(DomainError);
    expect(error).toMatchObject({ code: 'invalid_datalog', message: 'The file is empty.' });
    await expect(analyzeFileInWorker(join(dir, 'missing.csv'))).rejects.toThrow(/ENOENT/);
  });

  it('a thread kept warm after a small log serves the next ones with nothing left over from the last', async () => {
    const other = join(dir, 'other.csv');
    const otherText = generateLog({ pulls: [{ gears: [3] }], trimErrors: [{ rpm: [2000, 2500], map: [40, 50], trimPct: 6 }] }).text;
    writeFileSync(other, otherText);
    const expected = analyzeDatalog(new TextEncoder().encode(otherText), { vehicle: DEMO_VEHICLE });
    // A refused file in between: the thread that answered it is reused too.
    await expect(analyzeFileInWorker(join(dir, 'empty.csv'))).rejects.toThrow('The file is empty.');
    for (let i = 0; i < 3; i++) expect(await analyzeFileInWorker(other, { vehicle: DEMO_VEHICLE })).toEqual(expected);
  });

  it('works when the parent itself runs under tsx, as the API does', async () => {
    const root = resolve(import.meta.dirname, '../../../../..');
    const script = join(dir, 'under-tsx.mts');
    writeFileSync(
      script,
      `import { analyzeFileInWorker } from ${JSON.stringify(join(import.meta.dirname, 'analyze-file.ts'))};\n` +
        `const r = await analyzeFileInWorker(${JSON.stringify(logPath)});\nconsole.log(JSON.stringify({ rows: r.rows, knock: r.knock.events.length }));\n`,
    );
    const { stdout } = await promisify(execFile)(process.execPath, ['--import', 'tsx', script], {
      cwd: root,
    });
    expect(JSON.parse(stdout)).toEqual({ rows: text.trimEnd().split('\n').length - 1, knock: 1 });
  });
});
