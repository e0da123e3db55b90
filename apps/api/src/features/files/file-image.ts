import type { CalibrationFileRow } from '@revloop/db';
import { parseCalibration, type MemoryImage } from '@revloop/domain/calibration';
import type { AppDeps } from '../../context';

// Parsed images by content hash: blobs never change, and a diff's hex pages re-read the same two files.
const IMAGE_CACHE_SIZE = 8;
const imageCache = new Map<string, MemoryImage>();

export async function imageOf(deps: Pick<AppDeps, 'blobs'>, row: Pick<CalibrationFileRow, 'sha256' | 'original_name'>): Promise<MemoryImage> {
  const cached = imageCache.get(row.sha256);
  if (cached) return cached;
  const image = parseCalibration(await deps.blobs.read(row.sha256), row.original_name).image;
  imageCache.set(row.sha256, image);
  if (imageCache.size > IMAGE_CACHE_SIZE) imageCache.delete(imageCache.keys().next().value!);
  return image;
}
