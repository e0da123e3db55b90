import type { JobState } from '@revloop/domain/jobs';
import { JOB_STATE_LABELS } from '@revloop/domain/jobs';
import { Badge } from '../../../components/ui/badge';
import { STATE_TONES } from './job-format';

export function JobStateBadge({ state }: { state: JobState }) {
  return <Badge tone={STATE_TONES[state]}>{JOB_STATE_LABELS[state]}</Badge>;
}

/** Stale is said in words and with a mark, so it never relies on colour alone. */
export function StaleBadge() {
  return (
    <Badge tone="bad">
      <span aria-hidden="true" className="mr-1">
        ⚠
      </span>
      Stale
    </Badge>
  );
}
