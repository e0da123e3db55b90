import { describe, expect, it } from 'vitest';
import { shopSettingsFormSchema } from './shop-settings-form.schemas';

describe('shop settings form', () => {
  it('keeps only the log-check thresholds the owner filled in', () => {
    const out = shopSettingsFormSchema.parse({
      name: 'Kestrel Calibration Works',
      uploadLimitMiB: 16,
      holdUntilPaid: false,
      analysis: { warmCoolantC: 85, wotThresholdPct: undefined },
      defaults: [],
    });
    expect(out.settings.analysis).toEqual({ warmCoolantC: 85 });
  });

  it('refuses a threshold outside its sensible range', () => {
    const result = shopSettingsFormSchema.safeParse({ name: 'Shop', uploadLimitMiB: 16, holdUntilPaid: false, analysis: { wotThresholdPct: 20 }, defaults: [] });
    expect(result.success).toBe(false);
  });
});
