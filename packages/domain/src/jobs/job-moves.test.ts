import { describe, expect, it } from 'vitest';
import { defineAbilityFor } from '../auth/ability';
import type { Actor } from '../auth/roles';
import { systemActorFor } from '../auth/system-actor';
import { movesFrom, type JobFacts } from './job-machine';
import { assertTransition, availableTransitions } from './job-moves';
import { JOB_STATES, OPEN_STATES, type JobState } from './job-states';

// The buttons the UI shows and the check the server makes must agree for every move × actor: both go through
// job-moves.ts, and this walks every pair so a rule added on one side only shows up here. [CALC] exhaustive.

const SHOP = 'shop-a';
const person = (overrides: Partial<Actor>): Actor => ({
  userId: 'someone',
  platformAdmin: false,
  shopId: SHOP,
  role: null,
  dealerId: null,
  shopReadOnly: false,
  ...overrides,
});

/** Each actor with the tuner the job under test is assigned to. */
const ACTORS: Record<string, { actor: Actor; assigned: string | null }> = {
  owner: { actor: person({ userId: 'owner-a', role: 'owner' }), assigned: 'tuner-a' },
  assignedTuner: { actor: person({ userId: 'tuner-a', role: 'tuner' }), assigned: 'tuner-a' },
  otherTuner: { actor: person({ userId: 'tuner-b', role: 'tuner' }), assigned: 'tuner-a' },
  tunerOnUnassignedJob: { actor: person({ userId: 'tuner-b', role: 'tuner' }), assigned: null },
  jobCustomer: { actor: person({ userId: 'customer-a', role: 'customer' }), assigned: 'tuner-a' },
  otherCustomer: { actor: person({ userId: 'customer-b', role: 'customer' }), assigned: 'tuner-a' },
  jobDealer: { actor: person({ userId: 'dealer-user', role: 'dealer', dealerId: 'dealer-a' }), assigned: 'tuner-a' },
  otherDealer: { actor: person({ userId: 'dealer-user-b', role: 'dealer', dealerId: 'dealer-b' }), assigned: 'tuner-a' },
  system: { actor: systemActorFor(SHOP), assigned: 'tuner-a' },
  otherShopSystem: { actor: systemActorFor('shop-b'), assigned: 'tuner-a' },
  platformAdmin: { actor: person({ userId: 'admin', platformAdmin: true, shopId: null }), assigned: 'tuner-a' },
  readOnlyShopOwner: { actor: person({ userId: 'owner-a', role: 'owner', shopReadOnly: true }), assigned: 'tuner-a' },
};

const facts = (state: JobState, assigned: string | null, overrides: Partial<JobFacts> = {}): JobFacts => ({
  shopId: SHOP,
  state,
  heldFrom: null,
  round: 1,
  assignedTunerId: assigned,
  customerUserId: 'customer-a',
  dealerId: 'dealer-a',
  hasStockRead: true,
  hasRevisionForRound: true,
  awaitingApproval: false,
  hasLogForRound: true,
  ...overrides,
});

/** Every job situation worth telling apart: each state, each remembered hold, each precondition unmet. */
const SITUATIONS: Array<{ name: string; over: (assigned: string | null) => JobFacts }> = [
  ...JOB_STATES.filter((s) => s !== 'on_hold').map((state) => ({ name: state, over: (a: string | null) => facts(state, a) })),
  ...OPEN_STATES.filter((s) => s !== 'on_hold').map((heldFrom) => ({
    name: `on_hold from ${heldFrom}`,
    over: (a: string | null) => facts('on_hold', a, { heldFrom }),
  })),
  { name: 'on_hold from nowhere', over: (a) => facts('on_hold', a) },
  { name: 'intake without a read', over: (a) => facts('intake', a, { hasStockRead: false }) },
  { name: 'on_bench without a revision', over: (a) => facts('on_bench', a, { hasRevisionForRound: false }) },
  { name: 'on_bench with a draft awaiting approval', over: (a) => facts('on_bench', a, { awaitingApproval: true }) },
  { name: 'with_customer without a log', over: (a) => facts('with_customer', a, { hasLogForRound: false }) },
];

const cases = SITUATIONS.flatMap(({ name, over }) =>
  Object.keys(ACTORS).flatMap((kind) => JOB_STATES.map((to) => ({ name, over, kind, to }))),
);

describe('the UI offers exactly the moves the server accepts', () => {
  it.each(cases)('$name → $to by $kind', ({ over, kind, to }) => {
    const { actor, assigned } = ACTORS[kind]!;
    const job = over(assigned);
    const offered = availableTransitions(job, defineAbilityFor(actor)).some((t) => t.to === to);
    let accepted = true;
    try {
      assertTransition(job, actor, to);
    } catch {
      accepted = false;
    }
    expect(offered).toBe(accepted);
  });
});

describe('who makes which move', () => {
  const allowed = (kind: string, state: JobState, to: JobState, heldFrom: JobState | null = null) => {
    const { actor, assigned } = ACTORS[kind]!;
    return availableTransitions(facts(state, assigned, { heldFrom }), defineAbilityFor(actor)).some((t) => t.to === to);
  };

  it('the system actor makes only the automatic moves', () => {
    // Written out from the product rules: a read makes intake ready, a log starts the review, a payment releases its
    // hold; it never starts work, sends a revision (a person does, with a note), holds, finishes or cancels.
    const auto: Array<[JobState, JobState]> = [['intake', 'ready'], ['with_customer', 'log_review']];
    for (const state of OPEN_STATES) {
      for (const to of JOB_STATES) {
        const expected = state === 'on_hold' ? false : auto.some(([f, t]) => f === state && t === to);
        expect(allowed('system', state, to), `${state} → ${to}`).toBe(expected);
      }
    }
    for (const heldFrom of OPEN_STATES.filter((s) => s !== 'on_hold')) {
      expect(allowed('system', 'on_hold', heldFrom, heldFrom)).toBe(true);
      expect(allowed('system', 'on_hold', 'cancelled', heldFrom)).toBe(false);
    }
    expect(allowed('otherShopSystem', 'intake', 'ready')).toBe(false);
  });

  it('every move the machine has is open to the owner, and to nobody in a read-only shop or on the platform', () => {
    for (const { over } of SITUATIONS) {
      const job = over('tuner-a');
      const ownerMoves = availableTransitions(job, defineAbilityFor(ACTORS.owner!.actor)).map((t) => t.to);
      const ready = movesFrom(job).filter((m) => (m.guard?.(job) ?? null) === null).map((m) => m.to);
      expect(ownerMoves).toEqual(ready);
      expect(availableTransitions(job, defineAbilityFor(ACTORS.readOnlyShopOwner!.actor))).toEqual([]);
      expect(availableTransitions(job, defineAbilityFor(ACTORS.platformAdmin!.actor))).toEqual([]);
    }
  });

  it('answers shop_read_only in a read-only shop and forbidden to the platform admin', () => {
    const job = facts('intake', 'tuner-a');
    expect(() => assertTransition(job, ACTORS.readOnlyShopOwner!.actor, 'ready')).toThrow(expect.objectContaining({ code: 'shop_read_only' }));
    expect(() => assertTransition(job, ACTORS.platformAdmin!.actor, 'ready')).toThrow(
      expect.objectContaining({ code: 'forbidden', message: 'Only members of the shop can move its jobs.' }),
    );
  });
});
