/** Job states in the order a job normally moves through them (DESIGN.md, "job"). */
export const JOB_STATES = [
  'intake',
  'ready',
  'on_bench',
  'with_customer',
  'log_review',
  'dialed_in',
  'on_hold',
  'cancelled',
] as const;
export type JobState = (typeof JOB_STATES)[number];

export const JOB_STATE_LABELS: Record<JobState, string> = {
  intake: 'Intake',
  ready: 'Ready',
  on_bench: 'On the bench',
  with_customer: 'With customer',
  log_review: 'Log review',
  dialed_in: 'Dialed in',
  on_hold: 'On hold',
  cancelled: 'Cancelled',
};

/** States a job can still leave; `dialed_in` and `cancelled` are final. */
export const OPEN_STATES = [
  'intake',
  'ready',
  'on_bench',
  'with_customer',
  'log_review',
  'on_hold',
] as const satisfies readonly JobState[];
export type OpenJobState = (typeof OPEN_STATES)[number];

export const isJobState = (value: unknown): value is JobState =>
  typeof value === 'string' && (JOB_STATES as readonly string[]).includes(value);

export const isOpenState = (state: JobState): state is OpenJobState =>
  (OPEN_STATES as readonly JobState[]).includes(state);

/**
 * Hours after which a card in this state is highlighted as stale on the board; null for final states.
 * Shop defaults from common practice: the customer's flash-and-log step gets a week, shop steps a day or two.
 */
export const STALE_AFTER_HOURS: Record<JobState, number | null> = {
  intake: 72,
  ready: 24,
  on_bench: 48,
  with_customer: 168,
  log_review: 24,
  on_hold: 168,
  dialed_in: null,
  cancelled: null,
};

export const staleAfterHours = (state: JobState): number | null => STALE_AFTER_HOURS[state];
