import { describe, expect, it } from 'vitest';
import {
  type JobIntakeFormValues,
  jobIntakeSchema,
  messageInputSchema,
  packageInputSchema,
} from './job.schemas';

// Demo values for schema behaviour only.
const intake: JobIntakeFormValues = {
  customer: { kind: 'new', name: 'Demo Customer', email: 'demo@example.test' },
  vehicle: { kind: 'existing', vehicleId: 'veh_1' },
  packageId: 'pkg_1',
  goals: 'More midrange, keep it smooth for daily driving.',
  specialRequests: {
    revLimit: { rpm: 7000, notes: '' },
    tyreOrGearChange: { tyreSize: '245/40 R20' },
  },
  cautionsAccepted: true,
};

const paths = (result: { error?: { issues: { path: PropertyKey[] }[] } }) =>
  result.error?.issues.map((issue) => issue.path.join('.')) ?? [];

describe('jobIntakeSchema', () => {
  it('accepts a new customer with an existing vehicle and normalises a tyre change', () => {
    const job = jobIntakeSchema.parse(intake);
    expect(job.specialRequests.tyreOrGearChange?.tyreSize).toBe('245/40R20');
    expect(job.specialRequests.revLimit).toEqual({ rpm: 7000, notes: '' });
  });

  it('accepts an existing customer and a new vehicle checked by the vehicle schema', () => {
    const result = jobIntakeSchema.safeParse({
      ...intake,
      customer: { kind: 'existing', customerUserId: 'usr_1' },
      vehicle: { kind: 'new', vehicle: { vin: 'bad' } },
    });
    expect(paths(result)).toContain('vehicle.vehicle.vin');
  });

  it('insists the cautions were accepted', () => {
    const result = jobIntakeSchema.safeParse({ ...intake, cautionsAccepted: false });
    expect(result.error?.issues[0]?.message).toBe(
      'The customer must accept the cautions before the job opens.',
    );
  });

  it('refuses a bad email, empty goals and an absurd rev limit', () => {
    const result = jobIntakeSchema.safeParse({
      ...intake,
      customer: { kind: 'new', name: 'A', email: 'not-an-email' },
      goals: '  ',
      specialRequests: { revLimit: { rpm: 40000 } },
    });
    expect(paths(result)).toEqual(['customer.email', 'goals', 'specialRequests.revLimit.rpm']);
  });
});

describe('packageInputSchema', () => {
  const pkg = {
    name: 'Stage 1',
    modules: ['ECM'],
    retailPriceMinor: 49900,
    dealerPriceMinor: 34900,
    roundsIncluded: 3,
  };

  it('accepts a package and defaults the description', () => {
    expect(packageInputSchema.parse(pkg).description).toBe('');
  });

  it.each([
    [{ modules: [] }, 'modules'],
    [{ modules: ['ECM', 'ECM'] }, 'modules'],
    [{ modules: ['ABS'] }, 'modules.0'],
    [{ dealerPriceMinor: 50000 }, 'dealerPriceMinor'],
    [{ retailPriceMinor: 499.5 }, 'retailPriceMinor'],
    [{ roundsIncluded: 0 }, 'roundsIncluded'],
    [{ roundsIncluded: 21 }, 'roundsIncluded'],
  ])('refuses %j at %s', (change, path) => {
    expect(paths(packageInputSchema.safeParse({ ...pkg, ...change }))).toEqual([path]);
  });
});

describe('messageInputSchema', () => {
  it('takes 1–5000 characters after trimming', () => {
    expect(messageInputSchema.safeParse({ body: ' hi ' }).data).toEqual({ body: 'hi' });
    expect(messageInputSchema.safeParse({ body: '   ' }).success).toBe(false);
    expect(messageInputSchema.safeParse({ body: 'x'.repeat(5001) }).success).toBe(false);
  });
});
