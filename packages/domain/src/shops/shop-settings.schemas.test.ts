import { describe, expect, it } from 'vitest';
import { logRequestFor, parseShopSettings } from './shop-settings.schemas';

describe('shop settings', () => {
  it('fills defaults and survives broken JSON', () => {
    expect(parseShopSettings('{}')).toEqual({ uploadLimitMiB: 16, timeZone: 'UTC', holdUntilPaid: false, logRequestDefaults: {}, imageSizes: {}, analysis: {} });
    expect(parseShopSettings('not json').uploadLimitMiB).toBe(16);
  });

  it('uses the shop’s own log request for an engine family, matched loosely', () => {
    const settings = parseShopSettings(
      JSON.stringify({ logRequestDefaults: { '2.0 Turbo I4': { channels: ['time', 'rpm'], warmupMinutes: 7, wotGears: 2, notes: 'x' } } }),
    );
    expect(logRequestFor(settings, '2.0 turbo i4').warmupMinutes).toBe(7);
    // Five minutes of warm-up is the trade's common practice [CP] (REFERENCES "Logging practice").
    expect(logRequestFor(settings, 'v8').warmupMinutes).toBe(5);
  });
});
