import { describe, expect, it } from 'vitest';
import { packageFormDefaults, packageFormSchema } from './package-form.schemas';

const base = { name: 'Engine calibration', description: '', modules: ['ECM' as const], roundsIncluded: 4 };

describe('packageFormSchema', () => {
  it('turns typed prices into integer minor units of the currency', () => {
    // USD has 2 minor digits, JPY 0 (ISO 4217 [STD]); 599.00 USD = 59900 cents [CALC].
    expect(packageFormSchema('USD').parse({ ...base, retailPrice: '599.00', dealerPrice: '449' })).toMatchObject({ retailPriceMinor: 59900, dealerPriceMinor: 44900 });
    expect(packageFormSchema('JPY').parse({ ...base, retailPrice: '1,250', dealerPrice: '1000' })).toMatchObject({ retailPriceMinor: 1250, dealerPriceMinor: 1000 });
  });

  it('refuses a price it cannot read, naming the field', () => {
    const result = packageFormSchema('USD').safeParse({ ...base, retailPrice: '12,50', dealerPrice: '10' });
    expect(result.success).toBe(false);
    expect(result.error?.issues[0]?.path).toEqual(['retailPrice']);
  });

  it('keeps the domain rule that the dealer price is not above retail', () => {
    const result = packageFormSchema('USD').safeParse({ ...base, retailPrice: '100', dealerPrice: '120' });
    expect(result.success).toBe(false);
    expect(result.error?.issues[0]?.message).toBe('The dealer price cannot be above the retail price.');
  });

  it('shows stored minor units as decimals when editing', () => {
    const pkg = { id: 'p', name: 'X', description: '', modules: ['ECM' as const], retailPriceMinor: 59900, dealerPriceMinor: 44900, roundsIncluded: 4, active: true, createdAt: '' };
    expect(packageFormDefaults(pkg, 'USD')).toMatchObject({ retailPrice: '599.00', dealerPrice: '449.00' });
  });
});
