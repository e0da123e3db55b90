import type { ShopRow } from '@revloop/db';
import { DomainError } from '@revloop/domain';
import { diffImages, hexView, pageDiffRanges } from '@revloop/domain/calibration';
import type { AppDeps } from '../../context';
import type { AuthContext } from '../../http/auth-context';
import { imageOf } from './file-image';
import { loadUnlockedFile } from './file-download.service';
import { loadFile, presentFile } from './file.service';

type ShopScoped = AuthContext & { shop: ShopRow };

/** Two files this viewer sees, of one module; anything else cannot be compared byte for byte. */
async function loadPair(deps: AppDeps, auth: ShopScoped, aId: string, bId: string, load = loadFile) {
  const a = await load(deps.db, auth, aId);
  const b = await load(deps.db, auth, bId);
  if (a.row.module !== b.row.module) {
    throw new DomainError('validation', `Only files of the same module can be compared: this is ${a.row.module} against ${b.row.module}.`);
  }
  return [a, b] as const;
}

/** The changed ranges between two files' images, one page at a time. */
export async function diffFiles(deps: AppDeps, auth: ShopScoped, aId: string, bId: string, q: { gap: number; page: number; pageSize: number }) {
  const [a, b] = await loadPair(deps, auth, aId, bId);
  const diff = diffImages(await imageOf(deps, a.row), await imageOf(deps, b.row), { mergeGap: q.gap });
  const page = pageDiffRanges(diff.ranges, q.page, q.pageSize);
  return {
    a: await presentFile(deps.db, auth, a.row, a.job),
    b: await presentFile(deps.db, auth, b.row, b.job),
    gap: q.gap,
    changedBytes: diff.changedBytes,
    comparedBytes: diff.comparedBytes,
    changedShare: diff.changedShare,
    ...page,
  };
}

/** Side-by-side hex rows of two files over one address range: the bytes themselves, so a file locked until paid is refused (402). */
export async function hexOfFiles(deps: AppDeps, auth: ShopScoped, aId: string, bId: string, q: { range: [number, number]; width: number }) {
  const [a, b] = await loadPair(deps, auth, aId, bId, loadUnlockedFile);
  const [start, end] = q.range;
  const rows = hexView(await imageOf(deps, a.row), await imageOf(deps, b.row), { start, end }, { width: q.width });
  return { range: { start, end }, width: q.width, rows, truncated: (rows.at(-1)?.address ?? start) + q.width < end };
}
