import { accountNoticeMail, formatMailDate } from '../mail/mail-templates';

/** The link that proves the e-mail of a sign-up from a shop's public page and opens the job. */
export const startTuneMail = (to: string, p: { shopName: string; packageName: string; url: string; expiresAt: Date }) =>
  accountNoticeMail(to, {
    subject: `Confirm your e-mail to start your tune with ${p.shopName}`,
    lines: [
      `Thank you for choosing ${p.shopName} (${p.packageName}).`,
      `Open this link to confirm your e-mail: your account and your job open together. It works once and expires on ${formatMailDate(p.expiresAt)}.`,
      'If you did not ask for this, ignore this mail: nothing is kept.',
      '',
      `Confirm and open your job: ${p.url}`,
    ],
  });
