import type { Actor } from '../auth/roles';
import { DomainError } from '../errors';
import { JOB_STATE_LABELS, type JobState, isOpenState } from './job-states';

/**
 * What the state machine needs to know about a job; the API derives the flags from its rows. The machine says
 * which moves exist and what each needs first (its guard); who may make a move is the abilities' rule
 * (auth/ability.ts), and `job-moves.ts` puts the two together.
 */
export interface JobFacts {
  shopId: string;
  state: JobState;
  /** The state a job on hold returns to; null unless `state` is `on_hold`. */
  heldFrom: JobState | null;
  /** Revisions sent to the customer so far: 0 until Rev 1 goes out. */
  round: number;
  assignedTunerId: string | null;
  customerUserId: string;
  dealerId: string | null;
  /** A stock read is on file (set by file upload, or recorded by hand by a tuner). */
  hasStockRead: boolean;
  /** Every module of the package has a revision draft for the coming round (number round + 1). */
  hasRevisionForRound: boolean;
  /** Some draft of the coming round still waits for a second person's approval (a shop setting asks for it). */
  awaitingApproval: boolean;
  /** A datalog for the revision now on the car (number round) is uploaded. */
  hasLogForRound: boolean;
}

export type Audience = 'customer' | 'dealer' | 'shop';

export interface AvailableTransition {
  to: JobState;
  /** Button text for the move. */
  label: string;
  /** The move is made with a "what changed" note for the customer (Send revision). */
  needsNote?: boolean;
}

export interface Move {
  from: JobState;
  to: JobState;
  label: string;
  /** The mover must say what changed (stored with the revisions it sends and shown to the customer). */
  needsNote?: boolean;
  /** Null when the move can be made now, else the reason it cannot. */
  guard?: (facts: JobFacts) => string | null;
}

export const canMarkReady = (facts: JobFacts): boolean =>
  facts.state === 'intake' && facts.hasStockRead;
export const canSendRevision = (facts: JobFacts): boolean =>
  facts.state === 'on_bench' && facts.hasRevisionForRound && !facts.awaitingApproval;
export const canStartLogReview = (facts: JobFacts): boolean =>
  facts.state === 'with_customer' && facts.hasLogForRound;
export const canResume = (facts: JobFacts): boolean =>
  facts.state === 'on_hold' &&
  facts.heldFrom !== null &&
  isOpenState(facts.heldFrom) &&
  facts.heldFrom !== 'on_hold';

const FORWARD_MOVES: readonly Move[] = [
  {
    from: 'intake',
    to: 'ready',
    label: 'Mark ready',
    guard: (f) => (canMarkReady(f) ? null : 'The stock read has not been received yet.'),
  },
  { from: 'ready', to: 'on_bench', label: 'Start work' },
  {
    from: 'on_bench',
    to: 'with_customer',
    label: 'Send revision',
    needsNote: true,
    guard: (f) =>
      canSendRevision(f)
        ? null
        : f.hasRevisionForRound
          ? `Revision ${f.round + 1} needs another person's approval before it goes out.`
          : `Upload revision ${f.round + 1} of every module before sending it.`,
  },
  {
    from: 'with_customer',
    to: 'log_review',
    label: 'Submit log for review',
    guard: (f) =>
      canStartLogReview(f) ? null : `No datalog has been uploaded for revision ${f.round} yet.`,
  },
  { from: 'log_review', to: 'on_bench', label: 'Revise again' },
  { from: 'log_review', to: 'dialed_in', label: 'Mark dialed in' },
];

/** Every move from `facts.state`, forward moves first, then hold/resume and cancel. */
export function movesFrom(facts: JobFacts): Move[] {
  const { state } = facts;
  if (!isOpenState(state)) return [];
  const moves = FORWARD_MOVES.filter((move) => move.from === state);
  if (state === 'on_hold') {
    if (facts.heldFrom !== null) {
      moves.push({
        from: state,
        to: facts.heldFrom,
        label: 'Resume',
        guard: (f) => (canResume(f) ? null : 'This job does not know which state to resume to.'),
      });
    }
  } else {
    moves.push({ from: state, to: 'on_hold', label: 'Put on hold' });
  }
  moves.push({ from: state, to: 'cancelled', label: 'Cancel job' });
  return moves;
}

/** The move from the job's state to `to`; throws 'invalid_transition' when the job has no such move. */
export function moveTo(facts: JobFacts, to: JobState): Move {
  const move = movesFrom(facts).find((candidate) => candidate.to === to);
  if (!move) {
    throw new DomainError(
      'invalid_transition',
      `A job in ${JOB_STATE_LABELS[facts.state]} cannot move to ${JOB_STATE_LABELS[to]}.`,
    );
  }
  return move;
}

/** Throws 'invalid_transition' with the reason when the move's precondition is unmet now. */
export function assertGuard(move: Move, facts: JobFacts): void {
  const unmet = move.guard?.(facts) ?? null;
  if (unmet !== null) throw new DomainError('invalid_transition', unmet);
}

/**
 * The job's facts after moving to `to` (call `assertTransition` first). Sending a revision starts the
 * next round; holding remembers where to resume. Pass the actor so a tuner who starts an unassigned job
 * takes it.
 */
export function applyTransition(facts: JobFacts, to: JobState, actor?: Actor): JobFacts {
  const next: JobFacts = { ...facts, state: to, heldFrom: to === 'on_hold' ? facts.state : null };
  if (facts.state === 'on_bench' && to === 'with_customer') {
    next.round = facts.round + 1;
    next.hasRevisionForRound = false;
    next.awaitingApproval = false;
    next.hasLogForRound = false;
  }
  if (to === 'on_bench' && facts.assignedTunerId === null && actor?.role === 'tuner') {
    next.assignedTunerId = actor.userId;
  }
  return next;
}

/**
 * What the customer side adds to a job's next step, beside the machine's facts: the billing rules decide it (paid
 * before download, `downloadLockFor` in billing/download-lock.rules.ts) and the API passes it in.
 */
export interface NextStepContext {
  /** The job's sent revisions are locked for its customer until the job is paid. */
  revisionsLocked?: boolean;
}

/** The moves a next step may offer beside its sentence: `pay` opens the job's own checkout. */
export const NEXT_STEP_ACTIONS = ['pay'] as const;
export type NextStepAction = (typeof NEXT_STEP_ACTIONS)[number];

/** The customer must pay before the next step can be taken: a sent revision waits, locked until the job is paid. */
const mustPayFirst = (facts: JobFacts, audience: Audience, context: NextStepContext): boolean =>
  audience === 'customer' &&
  context.revisionsLocked === true &&
  facts.round > 0 &&
  (facts.state === 'with_customer' || facts.state === 'dialed_in');

/** The move the page offers beside the next step for this audience, or null when the sentence is all. */
export function nextStepAction(facts: JobFacts, audience: Audience, context: NextStepContext = {}): NextStepAction | null {
  return mustPayFirst(facts, audience, context) ? 'pay' : null;
}

/** One plain sentence telling this audience what happens next. */
export function nextStep(facts: JobFacts, audience: Audience, context: NextStepContext = {}): string {
  const { state, round } = facts;
  const coming = round + 1;
  if (mustPayFirst(facts, audience, context)) {
    return state === 'dialed_in'
      ? `Finished: pay for this job to unlock revision ${round}, the final calibration, then flash it.`
      : `Pay for this job to unlock revision ${round}, then flash it, warm up and log as requested.`;
  }
  if (audience === 'shop') {
    switch (state) {
      case 'intake':
        return facts.hasStockRead
          ? 'The stock read is in: mark the job ready.'
          : 'Waiting for the stock read.';
      case 'ready':
        return 'Waiting for a tuner: start work to put it on the bench.';
      case 'on_bench':
        if (facts.hasRevisionForRound && facts.awaitingApproval) {
          return `Revision ${coming} is a draft waiting for approval by another tuner or the owner.`;
        }
        return facts.hasRevisionForRound
          ? `Revision ${coming} is a draft: check it, then send it with a note of what changed.`
          : `Prepare revision ${coming}${round > 0 ? ` from the log of revision ${round}` : ''}.`;
      case 'with_customer':
        return facts.hasLogForRound
          ? `The log for revision ${round} is in: start the log review.`
          : `Waiting for the customer to flash revision ${round} and send a log.`;
      case 'log_review':
        return `Review the log for revision ${round}, then revise again or mark the job dialed in.`;
      case 'dialed_in':
        return `Done: revision ${round} is the final calibration.`;
      case 'on_hold':
        return `On hold${facts.heldFrom ? ` from ${JOB_STATE_LABELS[facts.heldFrom]}` : ''}: resume when the payment or information arrives.`;
      case 'cancelled':
        return 'This job was cancelled.';
    }
  }
  const forDealer = audience === 'dealer';
  const car = forDealer ? "the customer's vehicle" : 'your vehicle';
  switch (state) {
    case 'intake':
      return `Read the calibration off ${car} and upload it as the stock read.`;
    case 'ready':
      return 'The stock read is in; a tuner will start work on it soon.';
    case 'on_bench':
      return round === 0
        ? 'A tuner is preparing revision 1.'
        : `A tuner is preparing revision ${coming} from the log of revision ${round}.`;
    case 'with_customer':
      return forDealer
        ? `Have the customer flash revision ${round}, warm up, then log as requested.`
        : `Flash revision ${round}, warm up, then log as requested.`;
    case 'log_review':
      return `The log for revision ${round} is being reviewed.`;
    case 'dialed_in':
      return `Finished: revision ${round} is the final calibration.`;
    case 'on_hold':
      return 'The job is on hold: check the messages for what the shop needs.';
    case 'cancelled':
      return 'This job was cancelled.';
  }
}
