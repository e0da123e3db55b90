import { createHash } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { insertAuditEvent, insertCalibrationFile, newId, type CalibrationFileFormat, type CalibrationModule, type Db } from '@revloop/db';
import {
  generateCalibrationImage,
  imageByteCount,
  imageCrc32,
  imageRanges,
  reviseImage,
  toIntelHex,
  toSrec,
  type MemoryImage,
} from '@revloop/domain/calibration';
import type { BlobStore } from '../../apps/api/src/storage/blob-store';
import type { SeededJob } from './jobs-scenario';
import type { SeededShop } from './seed-demo';

// Invented images only: the same vehicle model starts from the same stock calibration, and every revision is a few
// scaled table regions on top of its parent, as a tuner's change would be.
const IMAGE = {
  ECM: { size: 256 * 1024 },
  TCM: { size: 128 * 1024 },
  other: { size: 64 * 1024 },
} as const satisfies Record<CalibrationModule, { size: number }>;
// Address 0 for every format: a raw dump carries no address, so all three formats of one image compare equal.
const BASE_ADDRESS = 0;
const FORMATS: CalibrationFileFormat[] = ['raw', 'intel_hex', 'srec'];
const EXTENSION: Record<CalibrationFileFormat, string> = { raw: 'bin', intel_hex: 'hex', srec: 's37' };
const REVISION_NOTES = [
  'Fuel and spark for the new parts; torque limit raised a little.',
  'Leaned the full-throttle target slightly after the log; timing pulled 1° where knock showed.',
  'Part-throttle fuel trimmed to the logged trims; idle smoothed.',
  'Final touch: boost target rounded off at the top; no other changes.',
];

interface EncodedFile {
  bytes: Uint8Array;
  sha256: string;
  crc32: number;
  imageBytes: number;
  ranges: string;
}
const encoded = new Map<string, EncodedFile>();

/** The file bytes of an image in a format, with their hash; cached, so building many test apps encodes once. */
function fileBytes(key: string, image: MemoryImage, format: CalibrationFileFormat): EncodedFile {
  const cacheKey = `${key}:${format}`;
  let file = encoded.get(cacheKey);
  if (!file) {
    // A raw dump holds the bytes alone: the image is one segment, so its data is the file.
    const bytes =
      format === 'raw'
        ? image.segments[0]!.data
        : new TextEncoder().encode(format === 'intel_hex' ? toIntelHex(image, { recordLength: 32 }) : toSrec(image, { header: 'REVLOOP DEMO', recordLength: 32 }));
    file = {
      bytes,
      sha256: createHash('sha256').update(bytes).digest('hex'),
      crc32: imageCrc32(image),
      imageBytes: imageByteCount(image),
      ranges: JSON.stringify(imageRanges(image)),
    };
    encoded.set(cacheKey, file);
  }
  return file;
}

/**
 * Writes a demo file straight to its content-addressed place. Unlike uploads there is no fsync: a lost demo file is
 * rebuilt by re-seeding, and a hundred fsyncs would make every test app slow to build.
 */
function putDemoBlob(blobs: BlobStore, file: EncodedFile): { sha256: string; size: number } {
  const target = blobs.pathOf(file.sha256);
  if (!fs.existsSync(target)) {
    fs.mkdirSync(path.dirname(target), { recursive: true });
    fs.writeFileSync(target, file.bytes);
  }
  return { sha256: file.sha256, size: file.bytes.length };
}

const images = new Map<string, MemoryImage>();
function cachedImage(key: string, make: () => MemoryImage): MemoryImage {
  let image = images.get(key);
  if (!image) {
    image = make();
    images.set(key, image);
  }
  return image;
}

const hash = (text: string): number => [...text].reduce((h, c) => (Math.imul(h, 31) + c.charCodeAt(0)) >>> 0, 7);

interface JobContext {
  job: SeededJob;
  createdAt: number;
  stateChangedAt: number;
  tunerId: string | null;
  readerId: string;
}

/**
 * Reads and revisions for every seeded job past intake: a stock read per package module, then Rev 1..round on top of
 * it, in all three formats, uploaded by the right people at plausible times. One job's re-read matches its latest
 * revision and one differs from it, so the proof panel has both answers to show.
 */
export async function seedFiles(db: Db, blobs: BlobStore, shops: SeededShop[], jobs: SeededJob[]): Promise<void> {
  const rows = await db.selectFrom('jobs').select(['id', 'created_at', 'state_changed_at', 'assigned_tuner_id', 'has_stock_read']).execute();
  const byId = new Map(rows.map((r) => [r.id, r]));
  const shopOf = new Map(shops.map((s) => [s.shopId, s]));
  // Keys name a job by shop position and number, never by its random id, so every seeding builds the same bytes.
  const shopIndex = new Map(shops.map((s, i) => [s.shopId, i]));
  const reReads = { differs: false, matches: false };

  for (const [index, job] of jobs.entries()) {
    const row = byId.get(job.id);
    const shop = shopOf.get(job.shopId);
    if (!row || !shop || row.has_stock_read !== 1) continue;
    const context: JobContext = {
      job,
      createdAt: Date.parse(row.created_at),
      stateChangedAt: Date.parse(row.state_changed_at),
      tunerId: row.assigned_tuner_id,
      readerId: job.dealerId ? (shop.dealerUserId ?? job.customerUserId) : job.customerUserId,
    };
    const jobKey = `${shopIndex.get(job.shopId)}:${job.number}`;
    const steps = job.round + 2;
    const at = (step: number) => new Date(context.createdAt + ((context.stateChangedAt - context.createdAt) * step) / steps).toISOString();

    for (const [m, name] of job.modules.entries()) {
      const module = name as CalibrationModule;
      const vehicleKey = `${job.vehicle.description}:${module}`;
      const stock = cachedImage(vehicleKey, () => generateCalibrationImage({ seed: hash(vehicleKey), size: IMAGE[module].size, baseAddress: BASE_ADDRESS }));
      const readFormat = FORMATS[hash(vehicleKey) % 3]!;
      const read = await store(db, blobs, {
        job,
        module,
        key: vehicleKey,
        image: stock,
        format: readFormat,
        kind: 'read',
        name: `stock-read-${module.toLowerCase()}.${EXTENSION[readFormat]}`,
        by: context.readerId,
        at: at(0.5),
      });
      let parent = { id: read, image: stock };
      for (let revision = 1; revision <= job.round; revision += 1) {
        const key = `${jobKey}:${module}:${revision}`;
        const revised = cachedImage(key, () => reviseImage(parent.image, { seed: hash(key), edits: 4 + revision }));
        const format = FORMATS[(index + m + revision) % 3]!;
        const id = await store(db, blobs, {
          job,
          module,
          key,
          image: revised,
          format,
          kind: 'revision',
          revision,
          parentId: parent.id,
          notes: REVISION_NOTES[(revision - 1) % REVISION_NOTES.length]!,
          name: `rev${revision}-${module.toLowerCase()}.${EXTENSION[format]}`,
          by: context.tunerId ?? shop.ownerId,
          at: at(revision + 0.5),
        });
        parent = { id, image: revised };
      }
      if (m > 0 || job.round === 0 || !['with_customer', 'log_review'].includes(job.state)) continue;
      // One re-read that the customer's tool changed (the warning), one that proves the revision is on the car.
      const which = !reReads.differs ? 'differs' : !reReads.matches && job.state === 'log_review' ? 'matches' : null;
      if (!which) continue;
      reReads[which] = true;
      const tamperedKey = `${jobKey}:tampered`;
      const image = which === 'matches' ? parent.image : cachedImage(tamperedKey, () => reviseImage(parent.image, { seed: 99, edits: 3 }));
      await store(db, blobs, {
        job,
        module,
        key: which === 'matches' ? `${jobKey}:${module}:${job.round}` : tamperedKey,
        image,
        format: 'raw',
        kind: 're_read',
        name: `re-read-${module.toLowerCase()}.bin`,
        by: context.readerId,
        at: new Date(context.stateChangedAt + 60_000).toISOString(),
      });
    }
  }
}

interface StoreInput {
  job: SeededJob;
  module: CalibrationModule;
  key: string;
  image: MemoryImage;
  format: CalibrationFileFormat;
  kind: 'read' | 'revision' | 're_read';
  revision?: number;
  parentId?: string;
  notes?: string;
  name: string;
  by: string;
  at: string;
}

const LABEL: Record<CalibrationFileFormat, string> = { raw: 'Raw binary', intel_hex: 'Intel HEX', srec: 'Motorola S-record' };

async function store(db: Db, blobs: BlobStore, input: StoreInput): Promise<string> {
  const file = fileBytes(input.key, input.image, input.format);
  const blob = putDemoBlob(blobs, file);
  const id = newId();
  await insertCalibrationFile(db, {
    id,
    shop_id: input.job.shopId,
    job_id: input.job.id,
    module: input.module,
    kind: input.kind,
    revision_number: input.revision ?? null,
    for_round: input.revision ?? null,
    parent_file_id: input.parentId ?? null,
    notes: input.notes ?? '',
    original_name: input.name,
    format: input.format,
    sha256: blob.sha256,
    crc32: file.crc32,
    size_bytes: blob.size,
    image_bytes: file.imageBytes,
    ranges: file.ranges,
    uploaded_by_user_id: input.by,
    created_at: input.at,
  });
  const what = input.kind === 'revision' ? `Revision ${input.revision} (${input.module})` : `${input.kind === 'read' ? 'Read' : 'Re-read'} (${input.module})`;
  await insertAuditEvent(db, {
    id: newId(),
    shop_id: input.job.shopId,
    actor_user_id: input.by,
    action: 'file.uploaded',
    subject_type: 'Job',
    subject_id: input.job.id,
    details: JSON.stringify({ fileId: id, text: `${what} uploaded, ${LABEL[input.format]}` }),
    created_at: input.at,
  });
  return id;
}
