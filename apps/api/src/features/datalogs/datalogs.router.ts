import { Router, type RequestHandler } from 'express';
import { z } from 'zod';
import { findDatalogMapping, insertDatalog, listJobDatalogs, newId, saveDatalogMapping, updateDatalog } from '@revloop/db';
import { DomainError } from '@revloop/domain';
import {
  CANONICAL_CHANNELS,
  CHANNEL_INFO,
  UNIT_CHOICES,
  datalogMappingInputSchema,
  headerSignature,
  mapHeaders,
  trimGridToCsv,
  wotTableToCsv,
  type CanonicalChannel,
} from '@revloop/domain/datalog';
import type { JobState } from '@revloop/domain/jobs';
import { safeUploadName } from '@revloop/domain/calibration';
import { parseShopSettings } from '@revloop/domain/shops';
import type { AppDeps } from '../../context';
import { authorizeRow, requireShop } from '../../http/auth-context';
import { parseInput } from '../../http/validate';
import { singleFileUpload } from '../../storage/upload';
import { recordAudit } from '../audit/audit.service';
import { jobSubject, loadJob } from '../jobs/job.service';
import {
  compareReports,
  datalogAnalyzerOf,
  datalogRowToDatalog,
  fuelOf,
  loadDatalog,
  mappingOptions,
  readLogHeaders,
  readyReport,
  resolveMapping,
  vehicleSpecOf,
  type StoredMapping,
} from './datalog.service';
import { SeriesCache, downsampleChannel } from './datalog-series';
import { sampleAlignedRows } from './datalog-series-rows';

/** A finished or cancelled job keeps its logs but takes no new ones. */
const CLOSED_STATES: readonly JobState[] = ['dialed_in', 'cancelled'];

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

const csvName = (name: string) => name.replace(/\.[^.]*$/, '').replace(/[^\w.-]+/g, '_').slice(0, 80) || 'datalog';

/** Job-level routes under /api/jobs/:id/datalogs and log-level routes under /api/datalogs. */
export function createDatalogsRouter(deps: AppDeps): Router {
  const router = Router();
  const { db, clock, blobs } = deps;
  const analyzer = datalogAnalyzerOf(deps);
  const seriesCache = new SeriesCache();

  /** Refuses before a byte is stored: who may upload, and whether the job takes logs now. */
  const mayUpload: RequestHandler = async (req, res, next) => {
    const auth = requireShop(req);
    const job = await loadJob(db, auth, String(req.params.id));
    authorizeRow(auth, 'upload', 'Job', jobSubject(job));
    if (CLOSED_STATES.includes(job.state)) throw new DomainError('conflict', 'This job is finished: it takes no new logs.');
    res.locals.job = job;
    next();
  };

  router.post(
    '/jobs/:id/datalogs',
    mayUpload,
    singleFileUpload(blobs, 'file', (req) => parseShopSettings(requireShop(req).shop.settings).uploadLimitMiB * 1024 * 1024),
    async (req, res) => {
      const auth = requireShop(req);
      const job = res.locals.job as Awaited<ReturnType<typeof loadJob>>;
      const temp = req.file?.path;
      try {
        if (!req.file || !temp) throw new DomainError('validation', 'Choose a CSV log file to upload (form field "file").');
        const fields = parseInput(uploadFieldsSchema, req.body ?? {});
        // Browsers send the name as raw UTF-8 while multer reads it as Latin-1; the bytes convert back losslessly.
        const originalName = safeUploadName(Buffer.from(req.file.originalname, 'latin1').toString('utf8')).slice(0, 200);
        const headers = await readLogHeaders(temp);
        const signature = headerSignature(headers);
        const mapping = await resolveMapping(db, auth.shop.id, headers, signature, {
          ...(fields.map && { channels: fields.map }),
          ...(fields.units && { units: fields.units }),
          ...(fields.afrScale && { afrScale: fields.afrScale }),
          ...(fields.trimAxis && { trimAxis: fields.trimAxis }),
        });
        const spec = await vehicleSpecOf(db, job);
        const blob = await blobs.adopt(temp);
        const row = await insertDatalog(db, {
          id: newId(),
          shop_id: auth.shop.id,
          job_id: job.id,
          round: job.round,
          original_name: originalName,
          sha256: blob.sha256,
          size_bytes: blob.size,
          header_signature: signature,
          mapping: JSON.stringify(mapping),
          fuel: JSON.stringify(fuelOf(spec)),
          status: 'processing',
          error: null,
          report: null,
          uploaded_by: auth.user.id,
          created_at: clock.now().toISOString(),
        });
        await recordAudit(db, {
          shopId: auth.shop.id,
          actorUserId: auth.user.id,
          action: 'datalog.uploaded',
          subjectType: 'Job',
          subjectId: job.id,
          details: { datalogId: row.id, text: `Log ${row.original_name} uploaded (on ${job.round === 0 ? 'the stock calibration' : `revision ${job.round}`})` },
          at: clock.now(),
        });
        void analyzer.start(auth, row);
        res.status(202).json({ data: datalogRowToDatalog({ ...row, uploaded_by_name: auth.user.name }, analyzer.progressOf(row.id)) });
      } finally {
        // Adopted files were moved into the store; anything left at the temp path is a refused upload.
        await blobs.discard(temp);
      }
    },
  );

  router.get('/jobs/:id/datalogs', async (req, res) => {
    const auth = requireShop(req);
    const job = await loadJob(db, auth, req.params.id);
    authorizeRow(auth, 'read', 'Job', jobSubject(job));
    const rows = await listJobDatalogs(db, auth.shop.id, job.id);
    res.json({ data: rows.map((r) => datalogRowToDatalog(r, analyzer.progressOf(r.id))), meta: { total: rows.length } });
  });

  router.get('/datalogs/:id', async (req, res) => {
    const auth = requireShop(req);
    const { row, job } = await loadDatalog(db, auth, req.params.id);
    // A run this process does not know was cut off by a restart: start it again.
    if (row.status === 'processing' && !analyzer.isRunning(row.id)) void analyzer.start(auth, row);
    res.json({
      data: {
        ...datalogRowToDatalog(row, analyzer.progressOf(row.id)),
        job: { id: job.id, number: job.number, round: job.round, state: job.state, vehicle: job.vehicle_description },
        report: row.status === 'ready' && row.report ? JSON.parse(row.report) : null,
      },
    });
  });

  router.get('/datalogs/:id/series', async (req, res) => {
    const auth = requireShop(req);
    const { row } = await loadDatalog(db, auth, req.params.id);
    const report = readyReport(row);
    const q = parseInput(seriesQuerySchema, req.query);
    const mapping = JSON.parse(row.mapping) as StoredMapping;
    const columns = await seriesCache.get(`${row.sha256}|${row.mapping}|${row.fuel}`, {
      filePath: blobs.pathOf(row.sha256),
      options: { ...mappingOptions(mapping), fuel: JSON.parse(row.fuel) },
    });
    const from = q.from ?? 0;
    const to = q.to ?? report.durationS;
    if (to <= from) throw new DomainError('validation', '"to" must be later than "from".');
    const available = (Object.keys(columns) as CanonicalChannel[]).filter((c) => c !== 'time');
    const logged = q.channels.filter((c) => columns[c] !== undefined);
    const rows = q.sampling === 'rows' ? sampleAlignedRows(columns, logged, from, to, q.points) : null;
    res.json({
      data: {
        from,
        to,
        durationS: report.durationS,
        available,
        sampling: q.sampling,
        channels: logged.map((c) => ({
          channel: c,
          label: CHANNEL_INFO[c].label,
          unit: CHANNEL_INFO[c].unit,
          ...(rows ? { t: rows.t, v: rows.values.get(c)! } : downsampleChannel(columns.time, columns[c]!, from, to, q.points)),
        })),
        knock: report.knock.events.filter((e) => e.timeS >= from && e.timeS <= to),
      },
    });
  });

  router.get('/datalogs/:id/mapping', async (req, res) => {
    const auth = requireShop(req);
    const { row } = await loadDatalog(db, auth, req.params.id);
    const stored = JSON.parse(row.mapping) as StoredMapping;
    const proposal = mapHeaders(stored.headers, stored.overrides, stored.units ?? {});
    const remembered = await findDatalogMapping(db, auth.shop.id, row.header_signature);
    res.json({
      data: {
        headers: stored.headers,
        channels: Object.fromEntries(Object.entries(proposal.channels).map(([c, m]) => [c, m.header])),
        // The unit each column is read in now: stated, or read from its header (null = the channel's own unit).
        units: Object.fromEntries(Object.entries(proposal.channels).map(([c, m]) => [c, m.unitText])),
        stated: stored.units ?? {},
        afrScale: stored.afrScale ?? null,
        trimAxis: stored.trimAxis ?? null,
        unmapped: proposal.unmapped,
        canonical: CANONICAL_CHANNELS.map((channel) => ({
          channel,
          label: CHANNEL_INFO[channel].label,
          unit: CHANNEL_INFO[channel].unit,
          unitChoices: UNIT_CHOICES[CHANNEL_INFO[channel].quantity],
        })),
        remembered: remembered !== undefined,
      },
    });
  });

  router.put('/datalogs/:id/mapping', async (req, res) => {
    const auth = requireShop(req);
    const { row, job } = await loadDatalog(db, auth, req.params.id);
    authorizeRow(auth, 'upload', 'Job', jobSubject(job));
    if (row.status === 'processing') throw new DomainError('conflict', 'This log is still being checked. Try again in a moment.');
    const input = parseInput(datalogMappingInputSchema, req.body);
    const stored = JSON.parse(row.mapping) as StoredMapping;
    const units = Object.fromEntries(Object.entries(input.units ?? {}).filter(([, unit]) => unit.trim() !== ''));
    mapHeaders(stored.headers, input.channels, units);
    const mapping: StoredMapping = {
      headers: stored.headers,
      overrides: input.channels,
      units,
      ...(input.afrScale && { afrScale: input.afrScale }),
      ...(input.trimAxis && { trimAxis: input.trimAxis }),
    };
    const at = clock.now().toISOString();
    await saveDatalogMapping(db, { shop_id: auth.shop.id, header_signature: row.header_signature, mapping: JSON.stringify({ ...input, units }), updated_at: at });
    const updated = (await updateDatalog(db, auth.shop.id, row.id, { mapping: JSON.stringify(mapping), status: 'processing', error: null, report: null }))!;
    await recordAudit(db, {
      shopId: auth.shop.id,
      actorUserId: auth.user.id,
      action: 'datalog.mapping_confirmed',
      subjectType: 'Job',
      subjectId: job.id,
      details: { datalogId: row.id, text: `Column mapping of ${row.original_name} confirmed; the log is checked again` },
      at: clock.now(),
    });
    void analyzer.start(auth, updated);
    res.json({ data: datalogRowToDatalog({ ...updated, uploaded_by_name: row.uploaded_by_name }, analyzer.progressOf(row.id)) });
  });

  router.get('/datalogs/:id/export/:table', async (req, res) => {
    const auth = requireShop(req);
    const { row } = await loadDatalog(db, auth, req.params.id);
    const table = req.params.table;
    if (table !== 'trims.csv' && table !== 'wot.csv') throw new DomainError('not_found', 'Exports are trims.csv and wot.csv.');
    const report = readyReport(row);
    const csv = table === 'trims.csv' ? trimGridToCsv(report) : wotTableToCsv(report);
    res.set('Content-Type', 'text/csv; charset=utf-8');
    res.set('Content-Disposition', `attachment; filename="${csvName(row.original_name)}-${table === 'trims.csv' ? 'fuel-trims' : 'full-throttle'}.csv"`);
    res.send(csv);
  });

  router.get('/datalogs/:id/compare/:otherId', async (req, res) => {
    const auth = requireShop(req);
    const base = await loadDatalog(db, auth, req.params.id);
    const other = await loadDatalog(db, auth, req.params.otherId);
    if (base.row.job_id !== other.row.job_id) throw new DomainError('validation', 'Only two logs of the same job can be compared.');
    const summary = (r: typeof base.row) => ({ id: r.id, round: r.round, originalName: r.original_name, createdAt: r.created_at });
    res.json({ data: { base: summary(base.row), other: summary(other.row), ...compareReports(readyReport(base.row), readyReport(other.row)) } });
  });

  return router;
}
