import fc from 'fast-check';
import { cumsum } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { assertBalanceCovers, assertRefundable, crossesLowBalance, runningBalances } from './ledger.rules';

describe('runningBalances', () => {
  it('matches a cumulative sum computed by mathjs (property)', () => {
    fc.assert(
      fc.property(fc.array(fc.integer({ min: -1_000_000, max: 1_000_000 }), { maxLength: 50 }), (amounts) => {
        // oracle: mathjs cumsum, an independent implementation
        const expected = amounts.length ? (cumsum(amounts) as number[]) : [];
        expect(runningBalances(amounts)).toEqual(expected);
      }),
    );
  });
});

describe('dealer balance', () => {
  it('refuses a debit the balance does not cover, with both amounts in the message', () => {
    expect(() => assertBalanceCovers(20000, 45000, 'USD')).toThrow(
      expect.objectContaining({ code: 'insufficient_balance', message: expect.stringContaining('$200.00') }),
    );
    expect(() => assertBalanceCovers(45000, 45000, 'USD')).not.toThrow();
  });

  it('mails about a low balance only when a debit crosses the line', () => {
    expect(crossesLowBalance(90000, 45000, 45000)).toBe(false);
    expect(crossesLowBalance(90000, 44999, 45000)).toBe(true);
    expect(crossesLowBalance(40000, 10000, 45000)).toBe(false);
  });
});

describe('assertRefundable', () => {
  it('allows whole and partial refunds up to what is left', () => {
    expect(() => assertRefundable(60000, 0, 60000, 'USD')).not.toThrow();
    expect(() => assertRefundable(60000, 20000, 40001, 'USD')).toThrow(/At most \$400\.00/);
    expect(() => assertRefundable(60000, 60000, 1, 'USD')).toThrow(expect.objectContaining({ code: 'conflict' }));
    expect(() => assertRefundable(60000, 0, 0, 'USD')).toThrow(/above zero/);
  });
});
