import type { JobState } from '@revloop/domain/jobs';
import { JOB_STATE_LABELS } from '@revloop/domain/jobs';
import { Badge } from '../../../components/ui/badge';
import { cn } from '../../../lib/cn';
import { STATE_STYLES, StateIcon } from './job-state-style';

/** A job's state as a pill: its colour, its icon and its name (the same on board, table, job page and steps). */
export function JobStateBadge({ state }: { state: JobState }) {
  const style = STATE_STYLES[state];
  return (
    <span data-state={state} className={cn('inline-flex items-center gap-1 rounded-full px-2.5 py-0.5 text-xs font-medium whitespace-nowrap', style.soft, style.text)}>
      <StateIcon state={state} />
      {JOB_STATE_LABELS[state]}
    </span>
  );
}

/** Stale is said in words and with a mark, so it never relies on colour alone. */
/** A revision draft of the job waits for a second person's approval before it can be sent. */
export function ApprovalBadge() {
  return <Badge tone="warn">Awaiting approval</Badge>;
}

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
