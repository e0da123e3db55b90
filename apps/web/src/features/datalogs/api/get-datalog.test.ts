import { describe, expect, it } from 'vitest';
import { FAST_POLL_MS, processingPollMs } from './get-datalog';

const uploaded = '2026-12-02T10:00:00.000Z';
const at = (ms: number) => Date.parse(uploaded) + ms;

describe('processingPollMs', () => {
  it('stops polling when no log is being checked', () => {
    expect(processingPollMs([], at(0))).toBe(false);
    expect(processingPollMs([{ status: 'ready', createdAt: uploaded }], at(0))).toBe(false);
  });

  it('polls often enough for a fresh log to show within 300 ms of its upload, then eases off', () => {
    const fresh = processingPollMs([{ status: 'processing', createdAt: uploaded }], at(200));
    expect(fresh).toBe(FAST_POLL_MS);
    expect(FAST_POLL_MS).toBeLessThanOrEqual(150);
    expect(processingPollMs([{ status: 'processing', createdAt: uploaded }], at(60_000))).toBe(700);
  });
});
