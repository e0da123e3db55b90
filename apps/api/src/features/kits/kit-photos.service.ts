import fsp from 'node:fs/promises';
import { deleteKitPhoto, findKitPhoto, insertKitPhoto, listKitPhotos, newId, type KitPhotoRow } from '@revloop/db';
import type { KitPhoto } from '@revloop/contract';
import { DomainError } from '@revloop/domain';
import type { AppDeps } from '../../context';
import { authorizeRow } from '../../http/auth-context';
import type { ShopAuth } from '../rentals/rental-records';
import { loadKit, presentKitPhoto } from './kit.service';

/** Kit photos are small pictures of the kit's condition; 10 MiB each is generous for a phone photo. */
export const KIT_PHOTO_MAX_BYTES = 10 * 1024 * 1024;
const MAX_PHOTOS_PER_KIT = 20;

/**
 * The image type from the file's first bytes, never from its name or the browser's claim. Signatures (common
 * practice, from memory): JPEG starts FF D8 FF; PNG 89 50 4E 47 0D 0A 1A 0A; WebP "RIFF" then "WEBP" at offset 8.
 */
export function imageTypeOf(head: Buffer): string | null {
  if (head.length >= 3 && head[0] === 0xff && head[1] === 0xd8 && head[2] === 0xff) return 'image/jpeg';
  if (head.length >= 8 && head.subarray(0, 8).equals(Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]))) return 'image/png';
  if (head.length >= 12 && head.subarray(0, 4).toString('latin1') === 'RIFF' && head.subarray(8, 12).toString('latin1') === 'WEBP') return 'image/webp';
  return null;
}

async function readHead(file: string): Promise<Buffer> {
  const handle = await fsp.open(file, 'r');
  try {
    const buf = Buffer.alloc(12);
    const { bytesRead } = await handle.read(buf, 0, 12, 0);
    return buf.subarray(0, bytesRead);
  } finally {
    await handle.close();
  }
}

/**
 * POST /api/kits/:id/photos (owner). The upload already sits in a temporary file; the blob store fsyncs and renames it
 * into place under its hash, and only then is the row written. A refused file is removed and nothing is written.
 */
export async function addKitPhoto(deps: Pick<AppDeps, 'db' | 'blobs' | 'clock'>, auth: ShopAuth, kitId: string, upload: { path: string; originalname: string } | undefined): Promise<KitPhoto> {
  try {
    const kit = await loadKit(deps.db, auth, kitId);
    authorizeRow(auth, 'update', 'Kit', { shopId: kit.shop_id }, 'Kit not found.');
    if (!upload) throw new DomainError('validation', 'file: Choose a photo to upload.');
    const contentType = imageTypeOf(await readHead(upload.path));
    if (!contentType) throw new DomainError('validation', 'file: A kit photo must be a JPEG, PNG or WebP image.');
    if ((await listKitPhotos(deps.db, auth.shop.id, kit.id)).length >= MAX_PHOTOS_PER_KIT) throw new DomainError('conflict', `A kit keeps at most ${MAX_PHOTOS_PER_KIT} photos: delete one first.`);
    const blob = await deps.blobs.adopt(upload.path);
    const row = await insertKitPhoto(deps.db, {
      id: newId(),
      shop_id: auth.shop.id,
      kit_id: kit.id,
      sha256: blob.sha256,
      size_bytes: blob.size,
      content_type: contentType,
      original_name: upload.originalname.split(/[\\/]/).pop()!.slice(0, 200),
      uploaded_by_user_id: auth.user.id,
      created_at: deps.clock.now().toISOString(),
    });
    return presentKitPhoto(row);
  } catch (error) {
    await deps.blobs.discard(upload?.path);
    throw error;
  }
}

/** GET /api/kits/:id/photos/:photoId: anyone who may read the kit. */
export async function kitPhotoFile(deps: Pick<AppDeps, 'db'>, auth: ShopAuth, kitId: string, photoId: string): Promise<KitPhotoRow> {
  const kit = await loadKit(deps.db, auth, kitId);
  const row = await findKitPhoto(deps.db, auth.shop.id, kit.id, photoId);
  if (!row) throw new DomainError('not_found', 'Photo not found.');
  return row;
}

/**
 * DELETE /api/kits/:id/photos/:photoId (owner): the row goes. The bytes stay in the content-addressed store, which
 * other rows (calibration files, other photos) may share; unreferenced blobs are the store's own housekeeping.
 */
export async function removeKitPhoto(deps: Pick<AppDeps, 'db'>, auth: ShopAuth, kitId: string, photoId: string): Promise<void> {
  const kit = await loadKit(deps.db, auth, kitId);
  authorizeRow(auth, 'update', 'Kit', { shopId: kit.shop_id }, 'Kit not found.');
  const row = await findKitPhoto(deps.db, auth.shop.id, kit.id, photoId);
  if (!row || !(await deleteKitPhoto(deps.db, auth.shop.id, kit.id, row.id))) throw new DomainError('not_found', 'Photo not found.');
}
