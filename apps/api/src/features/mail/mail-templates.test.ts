import { describe, expect, it } from 'vitest';
import { formatMailDate, invitationMail, passwordResetMail } from './mail-templates';

// 2026-12-09 10:55:04 UTC, the moment a mail once printed as "Wed, 09 Dec 2026 10:55:04 GMT".
const moment = new Date(Date.UTC(2026, 11, 9, 10, 55, 4));

describe('mail dates', () => {
  it('writes a moment for people in the shop time zone', () => {
    // Central European Time is UTC+1 in December (IANA tz database, zone Europe/Berlin [3P]).
    expect(formatMailDate(moment, 'Europe/Berlin')).toBe('Wednesday, 9 December 2026 at 11:55 CET');
    // US Eastern Standard Time is UTC−5 in December, written as its offset (IANA tz database, zone America/New_York [3P]).
    expect(formatMailDate(moment, 'America/New_York')).toBe('Wednesday, 9 December 2026 at 05:55 GMT-5');
    expect(formatMailDate(moment)).toBe('Wednesday, 9 December 2026 at 10:55 UTC');
  });

  it('puts no raw timestamp into an invitation or a reset mail', () => {
    const invite = invitationMail('a@b.test', { shopName: 'S', roleLabel: 'tuner', inviterName: null, url: 'http://x/i', expiresAt: moment, timeZone: 'Europe/Berlin' });
    expect(invite.text).toContain('expires on Wednesday, 9 December 2026 at 11:55 CET.');
    expect(invite.text).not.toMatch(/GMT|\d{2}:\d{2}:\d{2}/);
    expect(passwordResetMail('a@b.test', { url: 'http://x/r', expiresAt: moment }).text).toContain('10:55 UTC');
  });
});
