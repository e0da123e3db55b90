import { describe, expect, it } from 'vitest';
import { assertJobVolume, assertSeatAvailable, seatLimit } from './plan-limits.rules';
import { planById } from './plans';

describe('plan limits', () => {
  const workshop = planById('workshop');

  it('counts paid seats, or the plan maximum during a trial', () => {
    expect(seatLimit(workshop, 3, false)).toBe(3);
    expect(seatLimit(workshop, 3, true)).toBe(workshop.maxSeats);
  });

  it('refuses the seat after the last one with a plain way out', () => {
    expect(() => assertSeatAvailable(workshop, 3, false, 2)).not.toThrow();
    expect(() => assertSeatAvailable(workshop, 3, false, 3)).toThrow(/All 3 tuner seats of the Workshop plan are taken/);
  });

  it('refuses the job after the month’s volume', () => {
    expect(() => assertJobVolume(workshop, workshop.jobsPerMonth - 1)).not.toThrow();
    expect(() => assertJobVolume(workshop, workshop.jobsPerMonth)).toThrow(/Billing page/);
  });
});
