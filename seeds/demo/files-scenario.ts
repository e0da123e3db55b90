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
import { fileLabel, recordAudit, type DiskBlobStore } from '@revloop/api';

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
function putDemoBlob(blobs: DiskBlobStore, file: EncodedFile): { sha256: string; size: number } {
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

/** The job a demo file belongs to; `key` names it by shop and number, never by its random id, so bytes repeat. */
export interface DemoFileJob {
  id: string;
  shopId: string;
  key: string;
  vehicleDescription: string;
}

/**
 * Reads, revisions and re-reads of the demo jobs, built as a tuner's work would be: the same vehicle model starts
 * from the same stock image, and every revision is a few scaled table regions on top of its parent.
 */
export class DemoFiles {
  private readonly latest = new Map<string, { id: string; image: MemoryImage; revision: number | null }>();

  constructor(
    private readonly db: Db,
    private readonly blobs: DiskBlobStore,
  ) {}

  async read(job: DemoFileJob, module: CalibrationModule, by: string, at: Date): Promise<void> {
    const vehicleKey = `${job.vehicleDescription}:${module}`;
    const stock = cachedImage(vehicleKey, () => generateCalibrationImage({ seed: hash(vehicleKey), size: IMAGE[module].size, baseAddress: BASE_ADDRESS }));
    const format = FORMATS[hash(vehicleKey) % 3]!;
    const id = await store(this.db, this.blobs, { job, module, key: vehicleKey, image: stock, format, kind: 'read', name: `stock-read-${module.toLowerCase()}.${EXTENSION[format]}`, by, at });
    this.latest.set(`${job.id}:${module}`, { id, image: stock, revision: null });
  }

  async revision(job: DemoFileJob, module: CalibrationModule, revision: number, by: string, at: Date): Promise<void> {
    const parent = this.latest.get(`${job.id}:${module}`);
    if (!parent) throw new Error(`demo job ${job.key} has no ${module} read to revise`);
    const key = `${job.key}:${module}:${revision}`;
    const image = cachedImage(key, () => reviseImage(parent.image, { seed: hash(key), edits: 4 + revision }));
    // Most revisions go out as raw binaries; every fourth in a text format, which takes longer to encode.
    const format = hash(key) % 4 === 0 ? FORMATS[1 + (hash(key) % 2)]! : 'raw';
    const id = await store(this.db, this.blobs, {
      job,
      module,
      key,
      image,
      format,
      kind: 'revision',
      revision,
      parentId: parent.id,
      notes: REVISION_NOTES[(revision - 1) % REVISION_NOTES.length]!,
      name: `rev${revision}-${module.toLowerCase()}.${EXTENSION[format]}`,
      by,
      at,
    });
    this.latest.set(`${job.id}:${module}`, { id, image, revision });
  }

  /** The customer (or their dealer) downloads the revision just sent, as the job page's button records it. */
  async downloaded(job: DemoFileJob, module: CalibrationModule, by: string, at: Date): Promise<void> {
    const sent = this.latest.get(`${job.id}:${module}`);
    if (!sent || sent.revision === null) throw new Error(`demo job ${job.key} has no ${module} revision to download`);
    const label = fileLabel({ kind: 'revision', module, revision_number: sent.revision });
    await recordAudit(this.db, { shopId: job.shopId, actorUserId: by, action: 'file.downloaded', subjectType: 'Job', subjectId: job.id, details: { fileId: sent.id, viaLink: false, text: `${label} downloaded` }, at });
  }

  /** A re-read of what is on the car: the latest revision itself, or one the customer's own tool changed. */
  async reRead(job: DemoFileJob, module: CalibrationModule, matches: boolean, by: string, at: Date): Promise<void> {
    const sent = this.latest.get(`${job.id}:${module}`);
    if (!sent) throw new Error(`demo job ${job.key} has no ${module} revision to re-read`);
    const key = matches ? `${job.key}:${module}:sent` : `${job.key}:${module}:tampered`;
    const image = matches ? sent.image : cachedImage(key, () => reviseImage(sent.image, { seed: 99, edits: 3 }));
    await store(this.db, this.blobs, { job, module, key, image, format: 'raw', kind: 're_read', name: `re-read-${module.toLowerCase()}.bin`, by, at });
  }
}

interface StoreInput {
  job: DemoFileJob;
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
  at: Date;
}

const LABEL: Record<CalibrationFileFormat, string> = { raw: 'Raw binary', intel_hex: 'Intel HEX', srec: 'Motorola S-record' };

async function store(db: Db, blobs: DiskBlobStore, input: StoreInput): Promise<string> {
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
    created_at: input.at.toISOString(),
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
    created_at: input.at.toISOString(),
  });
  return id;
}
