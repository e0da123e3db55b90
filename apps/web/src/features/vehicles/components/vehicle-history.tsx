import { Link } from 'react-router-dom';
import type { VehicleHistoryEvent } from '@revloop/contract';
import { formatCrc32 } from '@revloop/domain/calibration';
import { Badge } from '../../../components/ui/badge';
import { Banner } from '../../../components/ui/banner';
import { Card } from '../../../components/ui/card';
import { EmptyState } from '../../../components/ui/empty-state';
import { PageSpinner } from '../../../components/ui/spinner';
import { textLinkClasses } from '../../../components/ui/text-link';
import { paths } from '../../../config/paths';
import { errorMessage } from '../../../lib/form-errors';
import { formatDateTime } from '../../../lib/format';
import { useVehicleHistory } from '../api/get-vehicle-history';

const CHECK_TONE = { pass: 'ok', warn: 'warn', fail: 'bad' } as const;
const CHECK_WORD = { pass: 'Pass', warn: 'Warning', fail: 'Fail' } as const;

function title(e: VehicleHistoryEvent): string {
  switch (e.kind) {
    case 'read':
      return `${e.module} read received`;
    case 'revision':
      return `${e.module} Rev ${e.revisionNumber ?? '?'} sent`;
    case 're_read':
      return e.proves ? `${e.module} flash proven: re-read matches Rev ${e.proves.revisionNumber ?? '?'}` : `${e.module} re-read received`;
    case 'log':
      return `Log for round ${e.round}`;
  }
}

function Details({ e }: { e: VehicleHistoryEvent }) {
  if (e.kind === 'log') {
    if (e.status !== 'ready') return <p className="text-ink-700">{e.status === 'processing' ? 'Being analysed.' : 'The analysis failed.'}</p>;
    return (
      <>
        <Link to={paths.datalogs.report.getHref(e.datalogId)} className={textLinkClasses}>
          {e.name}
        </Link>
        <ul className="mt-1 flex flex-wrap gap-1.5" aria-label="Check results">
          {e.checks.map((c) => (
            <li key={c.id} title={c.message}>
              <Badge tone={CHECK_TONE[c.status]}>
                {c.id.replace(/_/g, ' ')}: {CHECK_WORD[c.status]}
              </Badge>
            </li>
          ))}
        </ul>
      </>
    );
  }
  return (
    <>
      <p className="text-ink-700">
        {e.name} · {(e.imageBytes / 1024).toLocaleString()} KiB · CRC-32 <span className="font-mono">{formatCrc32(e.crc32)}</span>
        {e.by && ` · by ${e.by}`}
      </p>
      {e.kind === 'revision' && e.notes && <p className="mt-1 whitespace-pre-wrap text-ink-900">What changed: {e.notes}</p>}
      {e.kind === 'read' && e.plausibility.status === 'unexpected_size' && (
        <Banner tone="warn" className="mt-2" title="Unexpected image size">
          {e.plausibility.message}
        </Banner>
      )}
      {e.kind === 're_read' && !e.proves && <p className="mt-1 text-ink-700">It matches no revision sent for this module; see the job's files for the comparison.</p>}
    </>
  );
}

/** Everything that happened to the vehicle across its jobs, newest first. */
export function VehicleHistory({ vehicleId }: { vehicleId: string }) {
  const history = useVehicleHistory(vehicleId);
  return (
    <Card title="History" description="Reads, revisions sent, logs and their checks, and flashes proven by a re-read, newest first.">
      {history.isPending ? (
        <PageSpinner label="Loading the history" />
      ) : history.isError ? (
        <Banner tone="bad">{errorMessage(history.error)}</Banner>
      ) : history.data.data.length === 0 ? (
        <EmptyState title="Nothing has happened yet">The history starts when the first read of this vehicle is uploaded to a job.</EmptyState>
      ) : (
        <ol className="relative flex flex-col gap-4 border-l border-ink-200 pl-4" aria-label="Vehicle history">
          {history.data.data.map((e) => (
            <li key={e.kind === 'log' ? e.datalogId : e.fileId} className="text-sm">
              <p className="font-medium text-ink-900">{title(e)}</p>
              <p className="text-xs text-ink-600">
                <time dateTime={e.at}>{formatDateTime(e.at)}</time> ·{' '}
                <Link to={paths.job.getHref(e.job.id)} className={textLinkClasses}>
                  job #{e.job.number}
                </Link>
              </p>
              <div className="mt-1">
                <Details e={e} />
              </div>
            </li>
          ))}
        </ol>
      )}
    </Card>
  );
}
