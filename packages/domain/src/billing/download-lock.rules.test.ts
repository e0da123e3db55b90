import { describe, expect, it } from 'vitest';
import { DomainError } from '../errors';
import { assertDownloadUnlocked, downloadLockFor, type DownloadLockFacts } from './download-lock.rules';

// The amounts are made up and stand for nothing: the rule compares what is due with nothing, no sum is checked here.
const unpaid: DownloadLockFacts = {
  file: { kind: 'revision', draft: false },
  job: { dealerId: null, paymentLockWaivedAt: null },
  shop: { paidBeforeDownload: true },
  payments: { priceMinor: 50_000, paidMinor: 0, refundedMinor: 0, currency: 'USD' },
  viewer: { shopStaff: false },
};
const withFacts = (patch: Partial<{ [K in keyof DownloadLockFacts]: Partial<DownloadLockFacts[K]> }>): DownloadLockFacts => ({
  file: { ...unpaid.file, ...patch.file },
  job: { ...unpaid.job, ...patch.job },
  shop: { ...unpaid.shop, ...patch.shop },
  payments: { ...unpaid.payments, ...patch.payments },
  viewer: { ...unpaid.viewer, ...patch.viewer },
});

describe('downloadLockFor', () => {
  it('locks a sent revision of an unpaid retail job for its customer, saying what is due', () => {
    const lock = downloadLockFor(unpaid);
    expect(lock).toMatchObject({ locked: true, reason: 'unpaid', dueMinor: 50_000 });
    expect(lock.message).toContain('$500.00');
  });

  it('never locks reads, re-reads or drafts', () => {
    expect(downloadLockFor(withFacts({ file: { kind: 'read' } }))).toMatchObject({ locked: false, reason: 'not_a_revision' });
    expect(downloadLockFor(withFacts({ file: { kind: 're_read' } }))).toMatchObject({ locked: false, reason: 'not_a_revision' });
    expect(downloadLockFor(withFacts({ file: { draft: true } }))).toMatchObject({ locked: false, reason: 'draft' });
  });

  it('never locks the shop’s own staff, a dealer’s job, or a shop that turned the setting off', () => {
    expect(downloadLockFor(withFacts({ viewer: { shopStaff: true } }))).toMatchObject({ locked: false, reason: 'shop_staff' });
    expect(downloadLockFor(withFacts({ job: { dealerId: 'dealer-1' } }))).toMatchObject({ locked: false, reason: 'dealer_job' });
    expect(downloadLockFor(withFacts({ shop: { paidBeforeDownload: false } }))).toMatchObject({ locked: false, reason: 'setting_off' });
  });

  it('opens once the owner waives it, or once the job is paid in full', () => {
    expect(downloadLockFor(withFacts({ job: { paymentLockWaivedAt: '2026-12-03T10:00:00.000Z' } }))).toMatchObject({ locked: false, reason: 'waived' });
    expect(downloadLockFor(withFacts({ payments: { paidMinor: 50_000 } }))).toMatchObject({ locked: false, reason: 'paid', dueMinor: 0 });
    expect(downloadLockFor(withFacts({ payments: { priceMinor: 0 } }))).toMatchObject({ locked: false, reason: 'paid' });
  });

  it('stays locked while part is due, and locks again when a payment is refunded', () => {
    expect(downloadLockFor(withFacts({ payments: { paidMinor: 20_000 } }))).toMatchObject({ locked: true, dueMinor: 30_000 });
    expect(downloadLockFor(withFacts({ payments: { paidMinor: 50_000, refundedMinor: 10_000 } }))).toMatchObject({ locked: true, dueMinor: 10_000 });
  });
});

describe('assertDownloadUnlocked', () => {
  it('refuses a locked file with payment_required and passes an open one', () => {
    expect(() => assertDownloadUnlocked(downloadLockFor(unpaid))).toThrow(DomainError);
    try {
      assertDownloadUnlocked(downloadLockFor(unpaid));
    } catch (error) {
      expect((error as DomainError).code).toBe('payment_required');
    }
    expect(() => assertDownloadUnlocked(downloadLockFor(withFacts({ file: { kind: 'read' } })))).not.toThrow();
  });
});
