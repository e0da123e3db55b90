import type { OutgoingMail } from './mailer';

/**
 * A moment as people read it, in the shop's time zone with its abbreviation ("Wednesday, 9 December 2026 at
 * 11:55 CET"), never a raw timestamp. Mails with no shop (a password reset) use UTC and say so.
 */
export function formatMailDate(date: Date, timeZone = 'UTC'): string {
  return new Intl.DateTimeFormat('en-GB', {
    weekday: 'long',
    day: 'numeric',
    month: 'long',
    year: 'numeric',
    hour: '2-digit',
    minute: '2-digit',
    timeZone,
    timeZoneName: 'short',
  }).format(date);
}

/** Plain-text mails with one clear link; the HTML part repeats it for mail clients that prefer HTML. */
function mail(to: string, subject: string, lines: string[], link?: { url: string; label: string }): OutgoingMail {
  const text = [...lines, ...(link ? ['', `${link.label}: ${link.url}`] : []), '', '— Revloop'].join('\n');
  const esc = (s: string) => s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;');
  const html = [
    ...lines.map((l) => `<p>${esc(l)}</p>`),
    link ? `<p><a href="${esc(link.url)}">${esc(link.label)}</a></p>` : '',
    '<p>— Revloop</p>',
  ].join('');
  return { to, subject, text, html };
}

export const invitationMail = (to: string, p: { shopName: string; roleLabel: string; inviterName: string | null; url: string; expiresAt: Date; timeZone: string }) =>
  mail(
    to,
    `You are invited to ${p.shopName} on Revloop`,
    [
      `${p.inviterName ?? 'The Revloop platform team'} invited you to join ${p.shopName} as ${p.roleLabel}.`,
      `The link works once and expires on ${formatMailDate(p.expiresAt, p.timeZone)}.`,
    ],
    { url: p.url, label: 'Accept the invitation' },
  );

export const passwordResetMail = (to: string, p: { url: string; expiresAt: Date }) =>
  mail(
    to,
    'Reset your Revloop password',
    [
      'Someone (hopefully you) asked to reset the password of this Revloop account.',
      `The link works once and expires on ${formatMailDate(p.expiresAt)}. If you did not ask, ignore this mail.`,
    ],
    { url: p.url, label: 'Choose a new password' },
  );

export const welcomeMail = (to: string, p: { shopName: string; url: string }) =>
  mail(to, `Welcome to Revloop, ${p.shopName}`, ['Your shop is ready. Invite your tuners, set up packages and dealers.'], {
    url: p.url,
    label: 'Open Revloop',
  });

export const accountNoticeMail = (to: string, p: { subject: string; lines: string[] }) => mail(to, p.subject, p.lines);
