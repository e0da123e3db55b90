import { Router, type Request, type RequestHandler, type Response } from 'express';
import { fileDiffQuerySchema as diffQuerySchema, uploadJobFileFieldsSchema as uploadFieldsSchema } from '@revloop/contract';
import { findCalibrationFile, findJob, type CalibrationFileRow, type JobListRow } from '@revloop/db';
import { DomainError } from '@revloop/domain';
import { diffImages, hexView, pageDiffRanges } from '@revloop/domain/calibration';
import { parseShopSettings } from '@revloop/domain/shops';
import { z } from 'zod';
import type { AppDeps } from '../../context';
import { authorizeRow, requireShop } from '../../http/auth-context';
import { parseInput } from '../../http/validate';
import { singleFileUpload } from '../../storage/upload';
import { jobSubject, loadJob } from '../jobs/job.service';
import { verifyFileLink } from './file-links';
import {
  fileAbilities,
  fileRowToApi,
  imageOf,
  listVisibleFiles,
  loadFile,
  recordDownload,
  storeUpload,
  verifyFile,
  downloadNameOf,
} from './file.service';

const ADDRESS = '(0x[0-9a-f]+|\\d+)';
const hexQuerySchema = z.object({
  range: z
    .string()
    .trim()
    .regex(new RegExp(`^${ADDRESS}-${ADDRESS}$`, 'i'), 'Give the range as start-end in decimal or 0x hex, e.g. 0x1000-0x1040.')
    .transform((v) => v.split('-').map(Number) as [number, number])
    .refine(([start, end]) => end > start, 'The range must end after it starts.'),
  width: z.coerce.number().int().min(4).max(64).default(16),
});

const linkQuerySchema = z.object({
  shop: z.string().min(1).max(100),
  exp: z.coerce.number().int().positive(),
  sig: z.string().min(1).max(200),
});

/** RFC 6266 attachment with an ASCII fallback and the UTF-8 name, so no header injection and no sniffing. */
function sendFile(deps: AppDeps, res: Response, row: CalibrationFileRow, name: string): void {
  res.attachment(name);
  res.set({ 'Content-Type': 'application/octet-stream', 'Content-Length': String(row.size_bytes), 'X-Content-Type-Options': 'nosniff', 'Cache-Control': 'private, no-store' });
  deps.blobs.stream(row.sha256).pipe(res);
}

function calibrationUpload(deps: AppDeps): RequestHandler {
  return singleFileUpload(deps.blobs, 'file', (req) => parseShopSettings(requireShop(req).shop.settings).uploadLimitMiB * 1024 * 1024);
}

export function createFilesRouter(deps: AppDeps): Router {
  const router = Router();
  const { db, clock } = deps;

  router.get('/jobs/:id/files', async (req, res) => {
    const auth = requireShop(req);
    const job = await loadJob(db, auth, req.params.id);
    authorizeRow(auth, 'read', 'Job', jobSubject(job));
    res.json({ data: await listVisibleFiles(db, auth, job), meta: fileAbilities(auth, job) });
  });

  router.post(
    '/jobs/:id/files',
    async (req: Request<{ id: string }>, _res, next) => {
      // Before the body is read: another shop's job, or one the user may not upload to, costs no disk.
      const auth = requireShop(req);
      const job = await loadJob(db, auth, req.params.id);
      authorizeRow(auth, 'upload', 'Job', jobSubject(job));
      next();
    },
    calibrationUpload(deps),
    async (req: Request<{ id: string }>, res) => {
      const auth = requireShop(req);
      const file = req.file;
      if (!file) throw new DomainError('validation', 'Attach the calibration file in the "file" field.');
      let fields: z.infer<typeof uploadFieldsSchema>;
      try {
        fields = parseInput(uploadFieldsSchema, req.body ?? {});
      } catch (error) {
        await deps.blobs.discard(file.path);
        throw error;
      }
      // Browsers send the name as raw UTF-8 while multer reads it as Latin-1; the bytes convert back losslessly.
      const originalName = Buffer.from(file.originalname, 'latin1').toString('utf8');
      const result = await storeUpload(deps, auth, req.params.id, { tempFile: file.path, originalName }, fields);
      res.status(201).json({ data: result.file, meta: { waitingFor: result.waitingFor, movedTo: result.movedTo, verification: result.verification } });
    },
  );

  router.get('/files/:id', async (req, res) => {
    const auth = requireShop(req);
    const { row, job } = await loadFile(db, auth, req.params.id);
    res.json({ data: fileRowToApi(row, job) });
  });

  router.get('/files/:id/download', async (req, res) => {
    if (req.query.sig !== undefined) {
      // An e-mailed link: the signature, not a session, grants this one file until it expires.
      const link = parseInput(linkQuerySchema, req.query);
      verifyFileLink(deps.env.FILE_LINK_SECRET, { shopId: link.shop, fileId: req.params.id, exp: link.exp }, link.sig, clock.now());
      const row = await findCalibrationFile(db, link.shop, req.params.id);
      const job = row && (await findJob(db, link.shop, row.job_id));
      if (!row || !job) throw new DomainError('not_found', 'File not found.');
      await recordDownload(db, clock.now(), row, { userId: null, viaLink: true });
      sendFile(deps, res, row, downloadNameOf(row, job));
      return;
    }
    const auth = requireShop(req);
    const { row, job } = await loadFile(db, auth, req.params.id);
    authorizeRow(auth, 'download', 'Job', jobSubject(job));
    await recordDownload(db, clock.now(), row, { userId: auth.user.id, viaLink: false });
    sendFile(deps, res, row, downloadNameOf(row, job));
  });

  router.get('/files/:id/verify', async (req, res) => {
    const auth = requireShop(req);
    const { row, job } = await loadFile(db, auth, req.params.id);
    if (!fileAbilities(auth, job).canVerify) throw new DomainError('forbidden', 'Only the shop checks files against its revisions.');
    res.json({ data: await verifyFile(deps, auth, row, job) });
  });

  async function loadPair(req: Request<{ a: string; b: string }>): Promise<[Awaited<ReturnType<typeof loadFile>>, Awaited<ReturnType<typeof loadFile>>]> {
    const auth = requireShop(req);
    const a = await loadFile(db, auth, req.params.a);
    const b = await loadFile(db, auth, req.params.b);
    if (a.row.module !== b.row.module) {
      throw new DomainError('validation', `Only files of the same module can be compared: this is ${a.row.module} against ${b.row.module}.`);
    }
    return [a, b];
  }

  const brief = (f: { row: CalibrationFileRow & { uploaded_by_name: string }; job: JobListRow }) => fileRowToApi(f.row, f.job);

  router.get('/files/:a/diff/:b', async (req, res) => {
    const [a, b] = await loadPair(req);
    const q = parseInput(diffQuerySchema, req.query);
    const diff = diffImages(await imageOf(deps, a.row), await imageOf(deps, b.row), { mergeGap: q.gap });
    const page = pageDiffRanges(diff.ranges, q.page, q.pageSize);
    res.json({
      data: {
        a: brief(a),
        b: brief(b),
        gap: q.gap,
        changedBytes: diff.changedBytes,
        comparedBytes: diff.comparedBytes,
        changedShare: diff.changedShare,
        ...page,
      },
    });
  });

  router.get('/files/:a/diff/:b/hex', async (req, res) => {
    const [a, b] = await loadPair(req);
    const q = parseInput(hexQuerySchema, req.query);
    const [start, end] = q.range;
    const rows = hexView(await imageOf(deps, a.row), await imageOf(deps, b.row), { start, end }, { width: q.width });
    res.json({ data: { range: { start, end }, width: q.width, rows, truncated: (rows.at(-1)?.address ?? start) + q.width < end } });
  });

  return router;
}
