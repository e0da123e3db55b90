import { Banner } from '../../../components/ui/banner';
import { Spinner } from '../../../components/ui/spinner';
import { errorMessage } from '../../../lib/form-errors';
import { useFileVerification } from '../api/get-file-verification';
import { hexAddress } from './file-format';

const SHOWN_RANGES = 5;

/** The proof check of one read or re-read: which revision it matches, how it differs, whether it belongs to another job. */
export function VerifyResult({ fileId }: { fileId: string }) {
  const check = useFileVerification(fileId, true);
  if (check.isPending) return <Spinner label="Checking the file" />;
  if (check.isError) return <Banner tone="bad" title="The check failed">{errorMessage(check.error)}</Banner>;
  const v = check.data.data;
  const tone = v.warning ? 'warn' : v.status === 'matches' ? 'ok' : 'neutral';
  const title = v.status === 'matches' ? (v.matchesRevision ? `Matches revision ${v.matchesRevision}` : 'Matches the read') : v.status === 'differs' ? `Differs in ${v.totalRanges} range${v.totalRanges === 1 ? '' : 's'}` : v.status === 'matches_older' ? `Matches revision ${v.matchesRevision} — not the latest` : 'Checked';
  return (
    <div className="flex flex-col gap-2">
      <Banner tone={tone} title={title}>
        <p>{v.status === 'not_compared' && v.foreignMessage ? 'Reads are checked against other jobs’ revisions.' : v.message}</p>
        {v.ranges.length > 0 && (
          <ul className="mt-1 font-mono text-xs">
            {v.ranges.slice(0, SHOWN_RANGES).map((r) => (
              <li key={r.start}>
                {hexAddress(r.start)}–{hexAddress(r.end - 1)}: {r.changedBytes} byte{r.changedBytes === 1 ? '' : 's'} changed
              </li>
            ))}
            {v.totalRanges > SHOWN_RANGES && <li>… and {v.totalRanges - SHOWN_RANGES} more (open the comparison for all)</li>}
          </ul>
        )}
      </Banner>
      {v.foreignMatch && (
        <Banner tone="bad" title="Same image as another job’s revision">
          {v.foreignMessage}
        </Banner>
      )}
    </div>
  );
}
