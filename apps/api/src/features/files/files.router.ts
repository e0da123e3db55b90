import { Router, type Request, type RequestHandler, type Response } from 'express';
import { DomainError } from '@revloop/domain';
import { parseShopSettings } from '@revloop/domain/shops';
import type { z } from 'zod';
import type { AppDeps } from '../../context';
import { authorizeRow, requireShop } from '../../http/auth-context';
import { parseInput } from '../../http/validate';
import { singleFileUpload } from '../../storage/upload';
import { jobSubject, loadJob } from '../jobs/job.service';
import { diffFiles, hexOfFiles } from './file-diff.service';
import { storeUpload } from './file-upload.service';
import { verifyVisibleFile } from './file-verify.service';
import { diffQuerySchema, hexQuerySchema, linkQuerySchema, uploadFieldsSchema } from './file.schemas';
import { approveDraft } from './file-approve.service';
import { downloadFile, downloadFileByLink, type FileDownload } from './file-download.service';
import { fileAbilities, listVisibleFiles, loadFile, presentFile } from './file.service';

/** RFC 6266 attachment with an ASCII fallback and the UTF-8 name, so no header injection and no sniffing. */
async function sendFile(deps: AppDeps, res: Response, { row, name }: FileDownload): Promise<void> {
  const body = await deps.blobs.stream(row.sha256);
  res.attachment(name);
  res.set({ 'Content-Type': 'application/octet-stream', 'Content-Length': String(row.size_bytes), 'X-Content-Type-Options': 'nosniff', 'Cache-Control': 'private, no-store' });
  body.pipe(res);
}

function calibrationUpload(deps: AppDeps): RequestHandler {
  return singleFileUpload(deps.blobs, 'file', (req) => parseShopSettings(requireShop(req).shop.settings).uploadLimitMiB * 1024 * 1024);
}

type JobParams = { jobId: string };

/** A job's files, mounted at /api/jobs/:jobId/files. */
export function createJobFilesRouter(deps: AppDeps): Router {
  const router = Router({ mergeParams: true });
  const { db } = deps;

  router.get('/', async (req: Request<JobParams>, res) => {
    const auth = requireShop(req);
    const job = await loadJob(db, auth, req.params.jobId);
    authorizeRow(auth, 'read', 'Job', jobSubject(job));
    res.json({ data: await listVisibleFiles(db, auth, job), meta: fileAbilities(auth, job) });
  });

  router.post(
    '/',
    async (req: Request<JobParams>, _res, next) => {
      // Before the body is read: another shop's job, or one the user may not upload to, costs no disk.
      const auth = requireShop(req);
      const job = await loadJob(db, auth, req.params.jobId);
      authorizeRow(auth, 'upload', 'Job', jobSubject(job));
      next();
    },
    calibrationUpload(deps),
    async (req: Request<JobParams>, res) => {
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
      const result = await storeUpload(deps, auth, req.params.jobId, { tempFile: file.path, originalName }, fields);
      res.status(201).json({ data: result.file, meta: { waitingFor: result.waitingFor, movedTo: result.movedTo, verification: result.verification } });
    },
  );

  return router;
}

/** File-level routes, mounted at /api/files. */
export function createFilesRouter(deps: AppDeps): Router {
  const router = Router();
  const { db } = deps;

  router.get('/:id', async (req, res) => {
    const auth = requireShop(req);
    const { row, job } = await loadFile(db, auth, req.params.id);
    res.json({ data: await presentFile(db, auth, row, job) });
  });

  router.get('/:id/download', async (req, res) => {
    const download =
      req.query.sig !== undefined
        ? await downloadFileByLink(deps, req.params.id, parseInput(linkQuerySchema, req.query))
        : await downloadFile(deps, requireShop(req), req.params.id);
    await sendFile(deps, res, download);
  });

  router.post('/:id/approve', async (req, res) => {
    const { file, jobInReach } = await approveDraft(deps, requireShop(req), req.params.id);
    res.json({ data: file, meta: { jobInReach } });
  });

  router.get('/:id/verify', async (req, res) => {
    res.json({ data: await verifyVisibleFile(deps, requireShop(req), req.params.id) });
  });

  router.get('/:a/diff/:b', async (req, res) => {
    const q = parseInput(diffQuerySchema, req.query);
    res.json({ data: await diffFiles(deps, requireShop(req), req.params.a, req.params.b, q) });
  });

  router.get('/:a/diff/:b/hex', async (req, res) => {
    const q = parseInput(hexQuerySchema, req.query);
    res.json({ data: await hexOfFiles(deps, requireShop(req), req.params.a, req.params.b, q) });
  });

  return router;
}
