import { describe, expect, it } from 'vitest';
import { expectedImageSizesFor, shopSettingsSchema } from '../shops/shop-settings.schemas';
import { readPlausibility } from './read-plausibility';

describe('readPlausibility', () => {
  // [CALC] 1 KiB = 1024 bytes, so 2 MiB = 2,097,152 bytes and 1.5 MiB = 1,572,864 bytes.
  const sizes = [2_097_152, 1_572_864];

  it('passes a read whose size is one of the expected ones', () => {
    expect(readPlausibility(2_097_152, sizes).status).toBe('ok');
  });

  it('flags a size that matches none, naming the expected sizes in KiB sorted', () => {
    const result = readPlausibility(1_048_576, sizes);
    expect(result.status).toBe('unexpected_size');
    expect(result.expectedBytes).toEqual([1_572_864, 2_097_152]);
    expect(result.message).toContain('1024 KiB');
    expect(result.message).toContain('1536 KiB, 2048 KiB');
  });

  it('says nothing is known when the shop set no sizes for the family', () => {
    expect(readPlausibility(1_048_576, undefined).status).toBe('unknown_family');
    expect(readPlausibility(1_048_576, []).status).toBe('unknown_family');
  });

  it('finds the family in the shop settings case- and punctuation-insensitively', () => {
    const settings = shopSettingsSchema.parse({ imageSizes: { '2.0 Turbo I4': sizes } });
    expect(expectedImageSizesFor(settings, '2.0 turbo i4')).toEqual(sizes);
    expect(expectedImageSizesFor(settings, '5.0 V8')).toBeUndefined();
  });

  it('refuses a size list that is empty or not whole bytes', () => {
    expect(shopSettingsSchema.safeParse({ imageSizes: { v8: [] } }).success).toBe(false);
    expect(shopSettingsSchema.safeParse({ imageSizes: { v8: [1.5] } }).success).toBe(false);
  });
});
