import { useRef, useState, type FormEvent } from 'react';
import { useAbility } from '@casl/react';
import type { Datalog } from '@revloop/contract';
import type { AppAbility } from '@revloop/domain/auth';
import type { LogRequest } from '@revloop/domain/datalog';
import type { JobState } from '@revloop/domain/jobs';
import { Banner } from '../../../components/ui/banner';
import { Button } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { Spinner } from '../../../components/ui/spinner';
import { TextLink } from '../../../components/ui/text-link';
import { paths } from '../../../config/paths';
import { errorMessage } from '../../../lib/form-errors';
import { formatDateTime } from '../../../lib/format';
import { revisionLabel } from '../api/get-datalog';
import { useJobDatalogs } from '../api/get-job-datalogs';
import { useUploadDatalog } from '../api/upload-datalog';
import { Checklist, checksSummary } from './checklist';
import { FullThrottleCautions } from './full-throttle-cautions';
import { ProgressBar } from './progress-bar';

/** What the panel needs of the job (`GET /api/jobs/:id`). */
export interface JobLogsPanelJob {
  state: JobState;
  round: number;
  logRequest: LogRequest;
  vehicle: { description: string };
  customer: { name: string };
}

/** A log can be added while the job is open; a finished or cancelled job keeps its logs read-only. */
const UPLOAD_STATES: readonly JobState[] = ['intake', 'ready', 'on_bench', 'with_customer', 'log_review', 'on_hold'];

const STATUS_TEXT: Record<Datalog['status'], string> = { processing: 'Checking…', ready: 'Checked', failed: 'Could not be read' };

function LatestLog({ log }: { log: Datalog }) {
  if (log.status === 'processing') return <ProgressBar label={`Checking ${log.originalName}`} value={log.progress} />;
  if (log.status === 'failed') {
    return (
      <Banner tone="bad" title={`${log.originalName} could not be read`}>
        {log.error} Export the log again as CSV and upload it once more.
      </Banner>
    );
  }
  const summary = checksSummary(log.checks);
  return (
    <div className="flex flex-col gap-3">
      <Banner tone={summary.tone} title={`${log.originalName}, logged on ${revisionLabel(log.round)}`}>
        {summary.text}
      </Banner>
      <Checklist checks={log.checks} />
      <p className="text-sm">
        <TextLink to={paths.datalogs.report.getHref(log.id)}>Open the full report</TextLink>
      </p>
    </div>
  );
}

function UploadForm({ jobId, job, requestShown }: { jobId: string; job: JobLogsPanelJob; requestShown: boolean }) {
  const upload = useUploadDatalog();
  const input = useRef<HTMLInputElement>(null);
  const [file, setFile] = useState<File | null>(null);
  const [sent, setSent] = useState(0);
  const [missing, setMissing] = useState(false);

  const submit = (event: FormEvent) => {
    event.preventDefault();
    if (!file) return setMissing(true);
    setSent(0);
    upload.mutate(
      { jobId, file, onProgress: setSent },
      {
        onSuccess: () => {
          setFile(null);
          if (input.current) input.current.value = '';
        },
      },
    );
  };

  const request = job.logRequest;
  return (
    <form onSubmit={submit} className="flex flex-col gap-3" noValidate>
      <p className="text-sm text-ink-700">
        The log is linked to the revision on the car now: <strong>{revisionLabel(job.round)}</strong>.{' '}
        {requestShown ? (
          'Record what the log request on this page asks for.'
        ) : (
          <>
            Requested: warm up about {request.warmupMinutes} minutes, then {request.wotGears} gear{request.wotGears === 1 ? '' : 's'} at full throttle with the
            pedal on the floor.
            {request.notes && <span className="mt-1 block">{request.notes}</span>}
          </>
        )}
      </p>
      <FullThrottleCautions />
      <div className="flex flex-col gap-1.5">
        <label htmlFor="datalog-file" className="text-sm font-medium text-ink-800">
          Datalog file (CSV)
        </label>
        <input
          ref={input}
          id="datalog-file"
          type="file"
          accept=".csv,.txt,.tsv,text/csv,text/plain"
          aria-invalid={missing || undefined}
          aria-describedby={missing ? 'datalog-file-error' : 'datalog-file-hint'}
          onChange={(e) => {
            setFile(e.target.files?.[0] ?? null);
            setMissing(false);
          }}
          className="block w-full text-sm text-ink-800 file:mr-3 file:rounded-lg file:border file:border-ink-300 file:bg-white file:px-3 file:py-2 file:text-sm file:font-medium hover:file:bg-ink-100"
        />
        <p id="datalog-file-hint" className="text-xs text-ink-600">
          Export from your logger as CSV (comma, semicolon or tab). Any column names and units: the shop confirms the mapping.
        </p>
        {missing && (
          <p id="datalog-file-error" className="text-sm text-bad">
            Choose the CSV log file first.
          </p>
        )}
      </div>
      {upload.isPending && <ProgressBar label="Uploading" value={sent} />}
      {upload.isError && (
        <Banner tone="bad" title="The log was not uploaded">
          {errorMessage(upload.error)}
        </Banner>
      )}
      <div>
        <Button type="submit" pending={upload.isPending}>
          Upload log
        </Button>
      </div>
    </form>
  );
}

/**
 * The job page's datalog panel: upload a log, see its checks at once, open the report.
 * `requestShown`: the page already shows the log request (the job page), so the upload form does not repeat it.
 */
export function JobLogsPanel({ jobId, job, requestShown = false }: { jobId: string; job: JobLogsPanelJob; requestShown?: boolean }) {
  const ability = useAbility<AppAbility>();
  const logs = useJobDatalogs(jobId);
  const canUpload = ability.can('upload', 'Job') && UPLOAD_STATES.includes(job.state);
  const [latest, ...earlier] = logs.data?.data ?? [];

  return (
    <Card title="Datalogs" description="Logs recorded on this car. Each is checked as soon as it arrives, so a bad log can be redone the same day.">
      <div className="flex flex-col gap-6">
        {logs.isPending && <Spinner label="Loading the logs" />}
        {logs.isError && <Banner tone="bad" title="The logs could not be loaded">{errorMessage(logs.error)}</Banner>}
        {latest ? <LatestLog log={latest} /> : logs.isSuccess && <p className="text-sm text-ink-600">No log yet.</p>}
        {canUpload && <UploadForm jobId={jobId} job={job} requestShown={requestShown} />}
        {earlier.length > 0 && (
          <div>
            <h3 className="mb-2 text-sm font-semibold text-ink-900">Earlier logs</h3>
            <ul className="divide-y divide-ink-100 text-sm">
              {earlier.map((log) => (
                <li key={log.id} className="flex flex-wrap items-baseline justify-between gap-2 py-2">
                  <span className="min-w-0">
                    <TextLink to={paths.datalogs.report.getHref(log.id)}>{log.originalName}</TextLink>{' '}
                    <span className="text-ink-600">
                      on {revisionLabel(log.round)}, {formatDateTime(log.createdAt)}
                    </span>
                  </span>
                  <span className="text-ink-700">
                    {STATUS_TEXT[log.status]}
                    {log.status === 'ready' && `: ${log.checks.filter((c) => c.status === 'pass').length}/${log.checks.length} checks passed`}
                  </span>
                </li>
              ))}
            </ul>
          </div>
        )}
      </div>
    </Card>
  );
}
