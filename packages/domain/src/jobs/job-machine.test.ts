import { describe, expect, it } from 'vitest';
import { defineAbilityFor } from '../auth/ability';
import type { Actor } from '../auth/roles';
import { type JobFacts, applyTransition, canMarkReady, nextStep, nextStepAction } from './job-machine';
import { assertMoveNote, assertTransition, availableTransitions } from './job-moves';
import {
  JOB_STATES,
  JOB_STATE_LABELS,
  type JobState,
  OPEN_STATES,
  staleAfterHours,
} from './job-states';

const base = (state: JobState, overrides: Partial<JobFacts> = {}): JobFacts => ({
  shopId: 'shop-a',
  state,
  heldFrom: null,
  round: 1,
  assignedTunerId: 'tuner-a',
  customerUserId: 'customer-a',
  dealerId: 'dealer-a',
  hasStockRead: true,
  hasRevisionForRound: true,
  awaitingApproval: false,
  hasLogForRound: true,
  ...overrides,
});

const actor = (overrides: Partial<Actor>): Actor => ({
  userId: 'someone',
  platformAdmin: false,
  shopId: 'shop-a',
  role: null,
  dealerId: null,
  shopReadOnly: false,
  ...overrides,
});

/** Each actor kind with the assignment it implies for the job under test. */
const ACTORS = {
  owner: { actor: actor({ userId: 'owner-a', role: 'owner' }), assigned: 'tuner-a' },
  assignedTuner: { actor: actor({ userId: 'tuner-a', role: 'tuner' }), assigned: 'tuner-a' },
  unassignedJobTuner: { actor: actor({ userId: 'tuner-b', role: 'tuner' }), assigned: null },
  otherTuner: { actor: actor({ userId: 'tuner-b', role: 'tuner' }), assigned: 'tuner-a' },
  jobCustomer: { actor: actor({ userId: 'customer-a', role: 'customer' }), assigned: 'tuner-a' },
  otherCustomer: { actor: actor({ userId: 'customer-b', role: 'customer' }), assigned: 'tuner-a' },
  jobDealer: {
    actor: actor({ userId: 'dealer-user', role: 'dealer', dealerId: 'dealer-a' }),
    assigned: 'tuner-a',
  },
  otherDealer: {
    actor: actor({ userId: 'dealer-user-b', role: 'dealer', dealerId: 'dealer-b' }),
    assigned: 'tuner-a',
  },
  platformAdmin: {
    actor: actor({ userId: 'admin', platformAdmin: true, shopId: null }),
    assigned: 'tuner-a',
  },
  readOnlyOwner: {
    actor: actor({ userId: 'owner-a', role: 'owner', shopReadOnly: true }),
    assigned: 'tuner-a',
  },
} as const;
type ActorKind = keyof typeof ACTORS;

const STAFF: ActorKind[] = ['owner', 'assignedTuner', 'unassignedJobTuner'];
const BENCH: ActorKind[] = ['owner', 'assignedTuner'];

// The moves and who may make them, written out from the job rules in DESIGN.md and the product brief.
const ALLOWED: Partial<Record<JobState, Partial<Record<JobState, ActorKind[]>>>> = {
  intake: { ready: STAFF, on_hold: STAFF, cancelled: ['owner', 'jobCustomer', 'jobDealer'] },
  ready: { on_bench: STAFF, on_hold: STAFF, cancelled: ['owner'] },
  on_bench: { with_customer: BENCH, on_hold: STAFF, cancelled: ['owner'] },
  with_customer: {
    log_review: [...STAFF, 'jobCustomer', 'jobDealer'],
    on_hold: STAFF,
    cancelled: ['owner'],
  },
  log_review: { on_bench: BENCH, dialed_in: BENCH, on_hold: STAFF, cancelled: ['owner'] },
};
// A job held from log_review may only go back there (or be cancelled).
const HELD_FROM: JobState = 'log_review';
const HOLD_MOVES: Partial<Record<JobState, ActorKind[]>> = {
  [HELD_FROM]: STAFF,
  cancelled: ['owner'],
};

const expectedCode = (kind: ActorKind) => {
  if (kind === 'readOnlyOwner') return 'shop_read_only';
  return 'forbidden';
};

const cases = JOB_STATES.flatMap((from) =>
  JOB_STATES.flatMap((to) =>
    (Object.keys(ACTORS) as ActorKind[]).map((kind) => {
      const table = from === 'on_hold' ? HOLD_MOVES : ALLOWED[from];
      const allowedKinds = table?.[to];
      const outcome =
        allowedKinds === undefined
          ? 'invalid_transition'
          : allowedKinds.includes(kind)
            ? 'ok'
            : expectedCode(kind);
      return { from, to, kind, outcome };
    }),
  ),
);

describe('job transition matrix', () => {
  it.each(cases)('$from → $to by $kind: $outcome', ({ from, to, kind, outcome }) => {
    const { actor: who, assigned } = ACTORS[kind];
    const facts = base(from, {
      assignedTunerId: assigned,
      heldFrom: from === 'on_hold' ? HELD_FROM : null,
    });
    const run = () => assertTransition(facts, who, to);
    if (outcome === 'ok') {
      expect(run).not.toThrow();
      expect(availableTransitions(facts, defineAbilityFor(who)).map((t) => t.to)).toContain(to);
    } else {
      expect(run).toThrow(expect.objectContaining({ name: 'DomainError', code: outcome }));
      expect(availableTransitions(facts, defineAbilityFor(who)).map((t) => t.to)).not.toContain(to);
    }
  });

  it('covers all 8 × 8 state pairs for every actor kind', () => {
    expect(cases).toHaveLength(8 * 8 * Object.keys(ACTORS).length);
  });
});

describe('guards', () => {
  const owner = ACTORS.owner.actor;

  it('intake → ready needs the stock read', () => {
    const facts = base('intake', { hasStockRead: false });
    expect(canMarkReady(facts)).toBe(false);
    expect(() => assertTransition(facts, owner, 'ready')).toThrow(
      expect.objectContaining({
        code: 'invalid_transition',
        message: 'The stock read has not been received yet.',
      }),
    );
    expect(availableTransitions(facts, defineAbilityFor(owner)).map((t) => t.to)).toEqual(['on_hold', 'cancelled']);
  });

  it('on_bench → with_customer needs the revision for the coming round', () => {
    const facts = base('on_bench', { round: 1, hasRevisionForRound: false });
    expect(() => assertTransition(facts, owner, 'with_customer')).toThrow(
      expect.objectContaining({
        code: 'invalid_transition',
        message: 'Upload revision 2 of every module before sending it.',
      }),
    );
  });

  it('on_bench → with_customer waits for the approval the shop asks for, and then needs a note', () => {
    const facts = base('on_bench', { round: 1, awaitingApproval: true });
    expect(() => assertTransition(facts, owner, 'with_customer')).toThrow(
      expect.objectContaining({ code: 'invalid_transition', message: "Revision 2 needs another person's approval before it goes out." }),
    );
    const approved = { ...facts, awaitingApproval: false };
    expect(availableTransitions(approved, defineAbilityFor(owner))[0]).toEqual({ to: 'with_customer', label: 'Send revision', needsNote: true });
    expect(() => assertMoveNote(approved, 'with_customer', '  ')).toThrow(expect.objectContaining({ code: 'validation' }));
    expect(() => assertMoveNote(approved, 'with_customer', 'Fuel trims at idle')).not.toThrow();
    expect(() => assertMoveNote(base('log_review'), 'on_bench', undefined)).not.toThrow();
  });

  it('with_customer → log_review needs the log, for the customer too', () => {
    const facts = base('with_customer', { hasLogForRound: false });
    expect(() => assertTransition(facts, ACTORS.jobCustomer.actor, 'log_review')).toThrow(
      expect.objectContaining({ code: 'invalid_transition' }),
    );
  });

  it('a hold without a remembered state cannot resume, only be cancelled', () => {
    const facts = base('on_hold', { heldFrom: null });
    expect(availableTransitions(facts, defineAbilityFor(owner)).map((t) => t.to)).toEqual(['cancelled']);
  });
});

describe('applyTransition', () => {
  it('sending a revision starts the next round and clears the per-round flags', () => {
    const next = applyTransition(base('on_bench', { round: 1 }), 'with_customer');
    expect(next).toMatchObject({
      state: 'with_customer',
      round: 2,
      hasRevisionForRound: false,
      hasLogForRound: false,
    });
  });

  it('hold remembers the state and resume clears it', () => {
    const held = applyTransition(base('log_review'), 'on_hold');
    expect(held).toMatchObject({ state: 'on_hold', heldFrom: 'log_review' });
    expect(applyTransition(held, 'log_review')).toMatchObject({
      state: 'log_review',
      heldFrom: null,
    });
  });

  it('a tuner starting an unassigned job takes it; the owner does not', () => {
    const facts = base('ready', { assignedTunerId: null });
    expect(
      applyTransition(facts, 'on_bench', ACTORS.unassignedJobTuner.actor).assignedTunerId,
    ).toBe('tuner-b');
    expect(applyTransition(facts, 'on_bench', ACTORS.owner.actor).assignedTunerId).toBeNull();
  });

  it('walks a two-round job from intake to dialed in', () => {
    const tuner = ACTORS.assignedTuner.actor;
    const customer = ACTORS.jobCustomer.actor;
    let facts = base('intake', {
      round: 0,
      assignedTunerId: null,
      hasRevisionForRound: false,
      hasLogForRound: false,
    });
    const step = (to: JobState, who: Actor, flags: Partial<JobFacts> = {}) => {
      facts = { ...facts, ...flags };
      assertTransition(facts, who, to);
      facts = applyTransition(facts, to, who);
    };
    step('ready', tuner);
    step('on_bench', tuner);
    step('with_customer', tuner, { hasRevisionForRound: true });
    step('log_review', customer, { hasLogForRound: true });
    step('on_bench', tuner);
    step('with_customer', tuner, { hasRevisionForRound: true });
    step('log_review', customer, { hasLogForRound: true });
    step('dialed_in', tuner);
    expect(facts).toMatchObject({ state: 'dialed_in', round: 2, assignedTunerId: 'tuner-a' });
  });
});

describe('labels, next steps and staleness', () => {
  it('uses the DESIGN.md labels', () => {
    expect(Object.values(JOB_STATE_LABELS)).toEqual([
      'Intake',
      'Ready',
      'On the bench',
      'With customer',
      'Log review',
      'Dialed in',
      'On hold',
      'Cancelled',
    ]);
  });

  it('tells the customer what to do with revision 2', () => {
    expect(nextStep(base('with_customer', { round: 2 }), 'customer')).toBe(
      'Flash revision 2, warm up, then log as requested.',
    );
    expect(nextStep(base('with_customer', { round: 2 }), 'dealer')).toMatch(
      /^Have the customer flash revision 2/,
    );
    expect(nextStep(base('on_bench', { round: 1, hasRevisionForRound: false }), 'shop')).toBe(
      'Prepare revision 2 from the log of revision 1.',
    );
  });

  it('asks the customer to pay first while the sent revision is locked until the job is paid', () => {
    const locked = { revisionsLocked: true };
    expect(nextStep(base('with_customer', { round: 1 }), 'customer', locked)).toBe(
      'Pay for this job to unlock revision 1, then flash it, warm up and log as requested.',
    );
    expect(nextStepAction(base('with_customer', { round: 1 }), 'customer', locked)).toBe('pay');
    expect(nextStep(base('dialed_in', { round: 3 }), 'customer', locked)).toBe(
      'Finished: pay for this job to unlock revision 3, the final calibration, then flash it.',
    );
    expect(nextStepAction(base('dialed_in', { round: 3 }), 'customer', locked)).toBe('pay');
    // Paid, waived or never locked: the usual sentence and nothing to click.
    expect(nextStep(base('with_customer', { round: 1 }), 'customer', { revisionsLocked: false })).toBe(
      'Flash revision 1, warm up, then log as requested.',
    );
    expect(nextStepAction(base('with_customer', { round: 1 }), 'customer')).toBeNull();
    // Nothing sent yet, or the work is elsewhere: the lock changes nothing.
    expect(nextStep(base('on_bench', { round: 0 }), 'customer', locked)).toBe('A tuner is preparing revision 1.');
    expect(nextStepAction(base('log_review', { round: 1 }), 'customer', locked)).toBeNull();
    // The lock is the customer's: the shop and a dealer (whose jobs are paid from its balance) read as before.
    expect(nextStep(base('with_customer', { round: 1, hasLogForRound: false }), 'shop', locked)).toBe(
      'Waiting for the customer to flash revision 1 and send a log.',
    );
    expect(nextStepAction(base('with_customer', { round: 1 }), 'dealer', locked)).toBeNull();
  });

  it('has a sentence for every state and audience', () => {
    for (const state of JOB_STATES) {
      for (const audience of ['customer', 'dealer', 'shop'] as const) {
        expect(
          nextStep(base(state, { heldFrom: state === 'on_hold' ? 'ready' : null }), audience),
        ).toMatch(/\.$/);
      }
    }
  });

  it('marks only open states as able to go stale', () => {
    for (const state of JOB_STATES) {
      expect(staleAfterHours(state) !== null).toBe(
        (OPEN_STATES as readonly JobState[]).includes(state),
      );
    }
  });
});
