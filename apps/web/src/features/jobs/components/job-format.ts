import { JOB_STATES, OPEN_STATES, type JobState } from '@revloop/domain/jobs';

/** "45 min", "5 h", "3 d 4 h": how long a job has sat in its state, rounded the way a person would say it. */
export function formatTimeInState(hours: number): string {
  if (!Number.isFinite(hours) || hours < 0) return '—';
  if (hours < 1) return `${Math.max(1, Math.round(hours * 60))} min`;
  if (hours < 24) return `${Math.floor(hours)} h`;
  const days = Math.floor(hours / 24);
  const rest = Math.floor(hours - days * 24);
  return rest > 0 && days < 7 ? `${days} d ${rest} h` : `${days} d`;
}

/** The normal path a job walks, for the customer's progress view (hold and cancel sit outside it). */
export const PROGRESS_STATES: readonly JobState[] = JOB_STATES.filter((state) => state !== 'on_hold' && state !== 'cancelled');

/** Where a job stands on the normal path: the index of its step, using the held-from state for a job on hold. */
export function progressIndex(state: JobState, heldFrom: JobState | null): number {
  const at = state === 'on_hold' && heldFrom ? heldFrom : state;
  return PROGRESS_STATES.indexOf(at);
}

export const BOARD_STATES = OPEN_STATES;
