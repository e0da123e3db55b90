import { describe, expect, it } from 'vitest';
import { newId, nowIso } from '../ids';
import { jobIn, twoShops } from '../testing/two-shops';
import {
  findCalibrationFile,
  findRevisionsWithImage,
  insertCalibrationFile,
  latestRead,
  latestRevision,
  listJobFiles,
  modulesRevisedForRound,
} from './calibration-file.repository';
import type { InsertableCalibrationFileRow } from './calibration-file.table';

const file = (shopId: string, jobId: string, userId: string, over: Partial<InsertableCalibrationFileRow> = {}): InsertableCalibrationFileRow => ({
  id: newId(),
  shop_id: shopId,
  job_id: jobId,
  module: 'ECM',
  kind: 'read',
  revision_number: null,
  for_round: null,
  parent_file_id: null,
  original_name: 'stock.bin',
  format: 'raw',
  sha256: 'a'.repeat(64),
  crc32: 0xcbf43926,
  size_bytes: 9,
  image_bytes: 9,
  ranges: '[{"start":0,"end":9}]',
  uploaded_by_user_id: userId,
  created_at: nowIso(),
  ...over,
});

describe('calibration file repository', () => {
  it('reads and lists only the shop’s own files', async () => {
    const { db, shopA, shopB, ownerB } = await twoShops();
    const job = await jobIn(db, shopB, ownerB, { number: 1001, state: 'on_bench' });
    const row = await insertCalibrationFile(db, file(shopB, job.id, ownerB));
    expect(await findCalibrationFile(db, shopA, row.id)).toBeUndefined();
    expect(await listJobFiles(db, shopA, job.id)).toEqual([]);
    expect(await latestRead(db, shopA, job.id, 'ECM')).toBeUndefined();
    expect((await findCalibrationFile(db, shopB, row.id))?.uploaded_by_name).toBe('B');
  });

  it('finds the latest revision and read of a module, and the modules revised for a round', async () => {
    const { db, shopB, ownerB } = await twoShops();
    const job = await jobIn(db, shopB, ownerB, { number: 1001, state: 'on_bench' });
    const read = await insertCalibrationFile(db, file(shopB, job.id, ownerB));
    const rev1 = await insertCalibrationFile(db, file(shopB, job.id, ownerB, { kind: 'revision', revision_number: 1, for_round: 1, parent_file_id: read.id }));
    await insertCalibrationFile(db, file(shopB, job.id, ownerB, { kind: 'revision', revision_number: 2, for_round: 2, parent_file_id: rev1.id }));
    expect((await latestRevision(db, shopB, job.id, 'ECM'))?.revision_number).toBe(2);
    expect(await latestRevision(db, shopB, job.id, 'TCM')).toBeUndefined();
    expect((await latestRead(db, shopB, job.id, 'ECM'))?.id).toBe(read.id);
    expect(await modulesRevisedForRound(db, shopB, job.id, 2)).toEqual(['ECM']);
    expect(await modulesRevisedForRound(db, shopB, job.id, 3)).toEqual([]);
  });

  it('refuses a second revision with the same number for a job and module', async () => {
    const { db, shopB, ownerB } = await twoShops();
    const job = await jobIn(db, shopB, ownerB, { number: 1001, state: 'on_bench' });
    await insertCalibrationFile(db, file(shopB, job.id, ownerB, { kind: 'revision', revision_number: 1, for_round: 1 }));
    await expect(insertCalibrationFile(db, file(shopB, job.id, ownerB, { kind: 'revision', revision_number: 1, for_round: 1 }))).rejects.toThrow(/unique constraint/i);
  });

  it('matches revisions of other jobs in the same shop only', async () => {
    const { db, shopA, shopB, ownerA, ownerB } = await twoShops();
    const jobB1 = await jobIn(db, shopB, ownerB, { number: 1001, state: 'on_bench' });
    const jobB2 = await jobIn(db, shopB, ownerB, { number: 1002, state: 'on_bench' });
    const jobA = await jobIn(db, shopA, ownerA, { number: 1001, state: 'on_bench' });
    await insertCalibrationFile(db, file(shopB, jobB1.id, ownerB, { kind: 'revision', revision_number: 1, for_round: 1 }));
    await insertCalibrationFile(db, file(shopA, jobA.id, ownerA, { kind: 'revision', revision_number: 1, for_round: 1 }));
    const image = { crc32: 0xcbf43926, imageBytes: 9 };
    const matches = await findRevisionsWithImage(db, shopB, image, jobB2.id);
    expect(matches.map((m) => [m.job_number, m.revision_number])).toEqual([[1001, 1]]);
    expect(await findRevisionsWithImage(db, shopB, image, jobB1.id)).toEqual([]);
    expect(await findRevisionsWithImage(db, shopB, { crc32: 1, imageBytes: 9 }, jobB2.id)).toEqual([]);
  });
});
