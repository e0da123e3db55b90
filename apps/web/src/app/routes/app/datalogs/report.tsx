import { useState } from 'react';
import { useParams } from 'react-router-dom';
import type { DatalogDetail } from '@revloop/contract';
import type { DatalogReport } from '@revloop/domain/datalog';
import { PageHeader } from '../../../../components/layout/page-header';
import { Banner } from '../../../../components/ui/banner';
import { Button, buttonClasses } from '../../../../components/ui/button';
import { Card } from '../../../../components/ui/card';
import { PageSpinner } from '../../../../components/ui/spinner';
import { TextLink } from '../../../../components/ui/text-link';
import { paths } from '../../../../config/paths';
import { datalogExportHref, revisionLabel, useDatalog } from '../../../../features/datalogs/api/get-datalog';
import { useJobDatalogs } from '../../../../features/datalogs/api/get-job-datalogs';
import { Checklist, checksSummary } from '../../../../features/datalogs/components/checklist';
import { CompareLogs } from '../../../../features/datalogs/components/compare-logs';
import { FullThrottleCautions } from '../../../../features/datalogs/components/full-throttle-cautions';
import { formatClock } from '../../../../features/datalogs/chart/time';
import { LogChart } from '../../../../features/datalogs/components/log-chart';
import { MappingDialog } from '../../../../features/datalogs/components/mapping-dialog';
import { ProgressBar } from '../../../../features/datalogs/components/progress-bar';
import { TrimHeatTable } from '../../../../features/datalogs/components/trim-heat-table';
import { WotTable } from '../../../../features/datalogs/components/wot-table';
import { isApiError } from '../../../../lib/api-client';
import { errorMessage } from '../../../../lib/form-errors';
import { formatDateTime } from '../../../../lib/format';

function ReportBody({ log, report, onFixColumns }: { log: DatalogDetail; report: DatalogReport; onFixColumns: () => void }) {
  const jobLogs = useJobDatalogs(log.jobId);
  const summary = checksSummary(report.checks);
  const others = (jobLogs.data?.data ?? []).filter((l) => l.id !== log.id && l.status === 'ready');
  return (
    <div className="flex flex-col gap-6">
      <Card title="Checks" description="Whether the log is usable, in plain words.">
        <div className="flex flex-col gap-3">
          <Banner tone={summary.tone}>{summary.text}</Banner>
          {report.afrScale?.correctionsWithheld && (
            <Banner tone="warn" title="Full-throttle fuel corrections are held back">
              <span className="flex flex-col items-start gap-2">
                {report.afrScale.reason} Confirm which scale the wideband writes before changing fuel.
                <Button size="sm" variant="secondary" onClick={onFixColumns}>
                  Confirm the AFR scale
                </Button>
              </span>
            </Banner>
          )}
          <Checklist checks={report.checks} />
          {report.notes.length > 0 && (
            <div className="text-sm text-ink-700">
              <p className="font-medium">How the log was read</p>
              <ul className="list-disc pl-5">
                {report.notes.map((note) => (
                  <li key={note}>{note}</li>
                ))}
              </ul>
            </div>
          )}
          {(report.unmapped?.length ?? 0) > 0 && (
            <p className="text-sm text-ink-700">
              <span className="font-medium">Columns left unread:</span> {report.unmapped.join(', ')}. Map one under “Confirm or fix columns” if it holds a channel.
            </p>
          )}
        </div>
      </Card>
      <Card
        title={`Fuel trim by engine speed and ${report.fuelTrim.axis === 'maf' ? 'airflow' : 'manifold pressure'}`}
        description="Warm, closed-loop samples only; cells with too few samples stay blank."
        actions={
          <a className={buttonClasses('secondary', 'sm')} href={datalogExportHref(log.id, 'trims')} download>
            Download trim corrections (CSV)
          </a>
        }
      >
        <TrimHeatTable grid={report.fuelTrim} />
      </Card>
      <Card
        title="Full throttle"
        description="Measured against commanded lambda; a positive error is lean and needs fuel added."
        actions={
          <a className={buttonClasses('secondary', 'sm')} href={datalogExportHref(log.id, 'wot')} download>
            Download full-throttle table (CSV)
          </a>
        }
      >
        <div className="flex flex-col gap-4">
          <WotTable pulls={report.wot.pulls} />
          <p className="text-sm text-ink-700">
            Knock: {report.knock.events.length === 0 ? 'none logged.' : `${report.knock.events.length} burst${report.knock.events.length === 1 ? '' : 's'}, up to ${report.knock.maxRetardDeg.toFixed(1)}° retard`}
            {report.knock.events.map((e) => ` · ${e.timeS.toFixed(1)} s at ${e.rpm === null ? '?' : Math.round(e.rpm)} rpm${e.gear === null ? '' : `, gear ${e.gear}`}`).join('')}
          </p>
          <FullThrottleCautions />
        </div>
      </Card>
      <Card
        title="Chart"
        description={`${report.rows.toLocaleString()} samples over ${formatClock(report.durationS)} (${Math.round(report.durationS)} s) at ${report.sampleRateHz} Hz. Over time, overlaid on another log of this job, or one channel against another.`}
      >
        <LogChart log={log} report={report} others={others} />
      </Card>
      <Card title="Compare with another log of this job" description="Before and after a revision: what changed in the trims and at full throttle.">
        <CompareLogs datalogId={log.id} others={others} />
      </Card>
    </div>
  );
}

function ReportScreen({ datalogId }: { datalogId: string }) {
  const query = useDatalog(datalogId);
  const [mappingOpen, setMappingOpen] = useState(false);
  if (query.isPending) return <PageSpinner label="Loading the log" />;
  if (query.isError) {
    const missing = isApiError(query.error) && query.error.status === 404;
    return (
      <Banner tone={missing ? 'warn' : 'bad'} title={missing ? 'Log not found' : 'The log could not be loaded'}>
        {missing ? 'There is no log with this address that you can open.' : errorMessage(query.error)}
      </Banner>
    );
  }
  const log = query.data.data;
  return (
    <>
      <div className="mb-3 text-sm">
        <TextLink to={paths.datalogs.jobLogs.getHref(log.jobId)}>← Logs of job {log.job.number}</TextLink>
      </div>
      <PageHeader
        title={`Log ${log.originalName}`}
        description={`Job ${log.job.number}, ${log.job.vehicle}. Logged on ${revisionLabel(log.round)}; uploaded ${formatDateTime(log.createdAt)}${log.uploadedBy ? ` by ${log.uploadedBy.name}` : ''}.`}
        actions={
          log.status !== 'processing' && (
            <Button variant="secondary" onClick={() => setMappingOpen(true)}>
              Confirm or fix columns
            </Button>
          )
        }
      />
      {log.status === 'processing' && <ProgressBar label="Checking the log" value={log.progress} />}
      {log.status === 'failed' && (
        <Banner tone="bad" title="This log could not be read">
          {log.error} If a column was taken for the wrong channel, fix the columns; otherwise export the log again as CSV.
        </Banner>
      )}
      {log.status === 'ready' && log.report && <ReportBody log={log} report={log.report} onFixColumns={() => setMappingOpen(true)} />}
      <MappingDialog datalogId={log.id} open={mappingOpen} onClose={() => setMappingOpen(false)} />
    </>
  );
}

export function DatalogReportRoute() {
  const { datalogId = '' } = useParams();
  return <ReportScreen datalogId={datalogId} />;
}
