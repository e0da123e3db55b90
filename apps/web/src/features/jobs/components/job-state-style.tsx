import type { JobState } from '@revloop/domain/jobs';
import { cn } from '../../../lib/cn';

/**
 * How each job state looks, defined once for the badge, the board's columns and the progress steps: its own
 * colour and its own icon, so colour is never the only cue (WCAG 1.4.1). The icons are drawn on a 16-unit grid.
 */
export const STATE_STYLES: Record<JobState, { text: string; soft: string; bar: string; icon: string }> = {
  // Inbox tray: the job has come in.
  intake: { text: 'text-state-intake', soft: 'bg-state-intake-soft', bar: 'bg-state-intake', icon: 'M2 9h3l1 2h4l1-2h3M2 9l2-6h8l2 6v4H2z' },
  // Flag: ready to start.
  ready: { text: 'text-state-ready', soft: 'bg-state-ready-soft', bar: 'bg-state-ready', icon: 'M4 14V2M4 3h8l-2 3 2 3H4' },
  // Wrench: a tuner is working on it.
  on_bench: { text: 'text-state-bench', soft: 'bg-state-bench-soft', bar: 'bg-state-bench', icon: 'M10 2a3.5 3.5 0 0 0-3 5L2.5 11.5l2 2L9 9a3.5 3.5 0 0 0 5-3l-2 1-2-1-1-2z' },
  // Car: the customer flashes and logs.
  with_customer: { text: 'text-state-customer', soft: 'bg-state-customer-soft', bar: 'bg-state-customer', icon: 'M2 11V8l2-4h8l2 4v3zM2 8h12M4.5 13.5v-2M11.5 13.5v-2' },
  // Line chart: the log is being read.
  log_review: { text: 'text-state-review', soft: 'bg-state-review-soft', bar: 'bg-state-review', icon: 'M2 2v12h12M4 11l3-4 2 2 4-5' },
  // Check mark: done.
  dialed_in: { text: 'text-state-done', soft: 'bg-state-done-soft', bar: 'bg-state-done', icon: 'M2.5 8.5l3.5 3.5 7.5-8' },
  // Pause bars.
  on_hold: { text: 'text-state-hold', soft: 'bg-state-hold-soft', bar: 'bg-state-hold', icon: 'M5.5 3v10M10.5 3v10' },
  // Cross.
  cancelled: { text: 'text-state-cancelled', soft: 'bg-state-cancelled-soft', bar: 'bg-state-cancelled', icon: 'M3.5 3.5l9 9M12.5 3.5l-9 9' },
};

/** The state's icon, decorative: the state's name is always written beside it. */
export function StateIcon({ state, className }: { state: JobState; className?: string }) {
  return (
    <svg aria-hidden="true" viewBox="0 0 16 16" className={cn('size-3.5 shrink-0', className)} fill="none" stroke="currentColor" strokeWidth="1.6" strokeLinecap="round" strokeLinejoin="round">
      <path d={STATE_STYLES[state].icon} />
    </svg>
  );
}
