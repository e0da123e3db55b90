import { Router, type Request } from 'express';
import { z } from 'zod';
import { listJobDatalogs } from '@revloop/db';
import { DomainError } from '@revloop/domain';
import { CANONICAL_CHANNELS, datalogMappingInputSchema } from '@revloop/domain/datalog';
import { parseShopSettings } from '@revloop/domain/shops';
import type { AppDeps } from '../../context';
import { authorizeRow, requireShop } from '../../http/auth-context';
import { parseInput } from '../../http/validate';
import { singleFileUpload } from '../../storage/upload';
import { jobSubject, loadJob } from '../jobs/job.service';
import { datalogRowToDatalog } from './datalog.presenter';
import { compareDatalogs, datalogMapping, datalogSeries, EXPORT_TABLES, exportDatalogTable, openDatalog } from './datalog-report.service';
import { assertTakesLogs, confirmMapping, uploadDatalog } from './datalog-upload.service';
import { datalogAnalyzerOf } from './datalog.service';

/** A JSON text field of a multipart upload, parsed with its schema; empty means "not given". */
const jsonField = <T extends z.ZodType>(schema: T, what: string) =>
  z
    .string()
    .max(8000)
    .optional()
    .transform((text, ctx): z.infer<T> | undefined => {
      if (text === undefined || text.trim() === '') return undefined;
      try {
        return schema.parse(JSON.parse(text));
      } catch {
        ctx.addIssue({ code: 'custom', message: what });
        return z.NEVER;
      }
    });
const uploadFieldsSchema = z.object({
  map: jsonField(datalogMappingInputSchema.shape.channels, 'map must be a JSON object of channel → column header.'),
  units: jsonField(datalogMappingInputSchema.shape.channels, 'units must be a JSON object of channel → unit, such as {"map":"psia"}.'),
  afrScale: datalogMappingInputSchema.shape.afrScale,
  trimAxis: datalogMappingInputSchema.shape.trimAxis,
});

const channelList = z
  .string()
  .transform((s) => [...new Set(s.split(',').map((c) => c.trim()).filter(Boolean))])
  .pipe(z.array(z.enum(CANONICAL_CHANNELS).exclude(['time'])).min(1, 'Name at least one channel.').max(8, 'At most 8 channels at once.'));
const seriesQuerySchema = z.object({
  channels: channelList,
  from: z.coerce.number().min(0).optional(),
  to: z.coerce.number().min(0).optional(),
  points: z.coerce.number().int().min(10).max(5000).default(2000),
  /** `lttb` keeps each channel's shape on its own; `rows` returns the same rows of every channel, for scatter plots. */
  sampling: z.enum(['lttb', 'rows']).default('lttb'),
});

const exportTableSchema = z.enum(EXPORT_TABLES, 'Exports are trims.csv and wot.csv.');

type JobParams = { jobId: string };

/** A job's logs, mounted at /api/jobs/:jobId/datalogs. */
export function createJobDatalogsRouter(deps: AppDeps): Router {
  const router = Router({ mergeParams: true });
  const { db, blobs } = deps;

  router.post(
    '/',
    async (req: Request<JobParams>, res, next) => {
      // Before a byte is stored: who may upload, and whether the job takes logs now.
      const auth = requireShop(req);
      const job = await loadJob(db, auth, req.params.jobId);
      authorizeRow(auth, 'upload', 'Job', jobSubject(job));
      assertTakesLogs(job);
      res.locals.job = job;
      next();
    },
    singleFileUpload(blobs, 'file', (req) => parseShopSettings(requireShop(req).shop.settings).uploadLimitMiB * 1024 * 1024),
    async (req: Request<JobParams>, res) => {
      const auth = requireShop(req);
      const file = req.file;
      let fields: z.infer<typeof uploadFieldsSchema>;
      try {
        if (!file) throw new DomainError('validation', 'Choose a CSV log file to upload (form field "file").');
        fields = parseInput(uploadFieldsSchema, req.body ?? {});
      } catch (error) {
        await blobs.discard(file?.path);
        throw error;
      }
      // Browsers send the name as raw UTF-8 while multer reads it as Latin-1; the bytes convert back losslessly.
      const originalName = Buffer.from(file.originalname, 'latin1').toString('utf8');
      const log = await uploadDatalog(deps, auth, res.locals.job as Awaited<ReturnType<typeof loadJob>>, { tempFile: file.path, originalName }, {
        ...(fields.map && { channels: fields.map }),
        ...(fields.units && { units: fields.units }),
        ...(fields.afrScale && { afrScale: fields.afrScale }),
        ...(fields.trimAxis && { trimAxis: fields.trimAxis }),
      });
      res.status(202).json({ data: log });
    },
  );

  router.get('/', async (req: Request<JobParams>, res) => {
    const auth = requireShop(req);
    const job = await loadJob(db, auth, req.params.jobId);
    authorizeRow(auth, 'read', 'Job', jobSubject(job));
    const rows = await listJobDatalogs(db, auth.shop.id, job.id);
    const progress = await datalogAnalyzerOf(deps).progressOfMany(rows.filter((r) => r.status === 'processing').map((r) => r.id));
    res.json({ data: rows.map((r) => datalogRowToDatalog(r, progress.get(r.id))), meta: { total: rows.length } });
  });

  return router;
}

/** Log-level routes, mounted at /api/datalogs. */
export function createDatalogsRouter(deps: AppDeps): Router {
  const router = Router();

  router.get('/:id', async (req, res) => {
    res.json({ data: await openDatalog(deps, requireShop(req), req.params.id) });
  });

  router.get('/:id/series', async (req, res) => {
    const q = parseInput(seriesQuerySchema, req.query);
    res.json({ data: await datalogSeries(deps, requireShop(req), req.params.id, q) });
  });

  router.get('/:id/mapping', async (req, res) => {
    res.json({ data: await datalogMapping(deps, requireShop(req), req.params.id) });
  });

  router.put('/:id/mapping', async (req, res) => {
    const input = parseInput(datalogMappingInputSchema, req.body);
    res.json({ data: await confirmMapping(deps, requireShop(req), req.params.id, input) });
  });

  router.get('/:id/export/:table', async (req, res) => {
    const auth = requireShop(req);
    const table = exportTableSchema.safeParse(req.params.table);
    if (!table.success) throw new DomainError('not_found', 'Exports are trims.csv and wot.csv.');
    const { csv, fileName } = await exportDatalogTable(deps, auth, req.params.id, table.data);
    res.set('Content-Type', 'text/csv; charset=utf-8');
    res.set('Content-Disposition', `attachment; filename="${fileName}"`);
    res.send(csv);
  });

  router.get('/:id/compare/:otherId', async (req, res) => {
    res.json({ data: await compareDatalogs(deps, requireShop(req), req.params.id, req.params.otherId) });
  });

  return router;
}
