import { describe, expect, it } from 'vitest';
import type { z } from 'zod';
import { jobIntakeSchema } from '@revloop/domain/jobs';
import { fieldId, flattenFieldErrors } from './intake-errors';

describe('flattenFieldErrors', () => {
  it('lists nested and array errors with their dotted paths, in order', () => {
    const errors = {
      packageId: { type: 'custom', message: 'Choose a package.' },
      vehicle: {
        vehicle: {
          vin: { type: 'custom', message: 'A VIN has 17 characters; this one has 5.' },
          transmission: { gearRatios: { message: 'Enter the gear ratios, first gear first.', type: 'custom', 1: { message: 'A gear ratio is at least 0.30.', type: 'too_small' } } },
        },
      },
      root: { message: 'ignored' },
    };
    expect(flattenFieldErrors(errors)).toEqual([
      { path: 'packageId', message: 'Choose a package.' },
      { path: 'vehicle.vehicle.vin', message: 'A VIN has 17 characters; this one has 5.' },
      { path: 'vehicle.vehicle.transmission.gearRatios', message: 'Enter the gear ratios, first gear first.' },
      { path: 'vehicle.vehicle.transmission.gearRatios.1', message: 'A gear ratio is at least 0.30.' },
    ]);
  });

  it('covers every issue the intake schema reports for an empty form', () => {
    const result = jobIntakeSchema.safeParse({ customer: { kind: 'new' }, vehicle: { kind: 'existing', vehicleId: '' }, packageId: '', goals: '' });
    expect(result.success).toBe(false);
    // Build the same tree react-hook-form's zod resolver builds: one leaf per issue path.
    const tree: Record<string, unknown> = {};
    for (const issue of (result as z.ZodSafeParseError<unknown>).error.issues) {
      let node = tree;
      for (const key of issue.path.map(String)) node = (node[key] ??= {}) as Record<string, unknown>;
      node.message ??= issue.message;
    }
    const paths = flattenFieldErrors(tree).map((e) => e.path);
    expect(paths).toEqual(expect.arrayContaining(['customer.name', 'customer.email', 'vehicle.vehicleId', 'packageId', 'goals', 'cautionsAccepted']));
  });

  it('turns a path into a DOM id', () => {
    expect(fieldId('intake', 'vehicle.vehicle.vin')).toBe('intake-vehicle-vehicle-vin');
  });
});
