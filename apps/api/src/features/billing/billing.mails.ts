import { formatMoney } from '@revloop/domain/billing';
import { accountNoticeMail, formatMailDate } from '../mail/mail-templates';

/** Billing mails: plain sentences, the amounts formatted in the currency they were paid in, one link. */
const notice = (to: string, subject: string, lines: string[], link: string) =>
  accountNoticeMail(to, { subject, lines: [...lines, '', `Open Revloop: ${link}`] });

export const jobReceiptMail = (to: string, p: { shopName: string; jobNumber: number; packageName: string; amountMinor: number; currency: string; link: string }) =>
  notice(
    to,
    `Receipt: ${formatMoney(p.amountMinor, p.currency)} paid to ${p.shopName}`,
    [`Thank you. ${p.shopName} received ${formatMoney(p.amountMinor, p.currency)} for job ${p.jobNumber} (${p.packageName}).`, 'Keep this mail as your receipt.'],
    p.link,
  );

export const refundMail = (to: string, p: { shopName: string; jobNumber: number; amountMinor: number; currency: string; reason: string; link: string }) =>
  notice(
    to,
    `Refund: ${formatMoney(p.amountMinor, p.currency)} from ${p.shopName}`,
    [`${p.shopName} refunded ${formatMoney(p.amountMinor, p.currency)} for job ${p.jobNumber}.`, `Reason: ${p.reason}`, 'The money goes back to the card you paid with; banks take a few days to show it.'],
    p.link,
  );

export const topUpReceiptMail = (to: string, p: { shopName: string; dealerName: string; amountMinor: number; balanceMinor: number; currency: string; link: string }) =>
  notice(
    to,
    `Receipt: ${formatMoney(p.amountMinor, p.currency)} added to the ${p.dealerName} balance`,
    [`${p.shopName} received ${formatMoney(p.amountMinor, p.currency)} for the prepaid balance of ${p.dealerName}.`, `The balance is now ${formatMoney(p.balanceMinor, p.currency)}.`],
    p.link,
  );

export const lowBalanceMail = (to: string, p: { shopName: string; dealerName: string; balanceMinor: number; nextJobMinor: number; currency: string; link: string }) =>
  notice(
    to,
    `Low balance: ${p.dealerName} at ${p.shopName}`,
    [
      `The prepaid balance of ${p.dealerName} is ${formatMoney(p.balanceMinor, p.currency)}, less than the ${formatMoney(p.nextJobMinor, p.currency)} the last job cost.`,
      'Top up the balance so the next job can be opened.',
    ],
    p.link,
  );

export const paymentFailedMail = (to: string, p: { shopName: string; graceEndsAt: Date; timeZone: string; link: string }) =>
  notice(
    to,
    `Payment failed for ${p.shopName}'s Revloop subscription`,
    [
      'The latest subscription payment was declined. Revloop will retry the card.',
      `Update the card before ${formatMailDate(p.graceEndsAt, p.timeZone)} to keep the shop open for changes; after that it becomes read-only until the payment succeeds.`,
    ],
    p.link,
  );

export const readOnlyMail = (to: string, p: { shopName: string; reason: string; link: string }) =>
  notice(to, `${p.shopName} is read-only on Revloop`, [p.reason, 'Everyone can still read and download; nothing can be changed until then.'], p.link);

export const restoredMail = (to: string, p: { shopName: string; link: string }) =>
  notice(to, `${p.shopName} is open again on Revloop`, ['Thank you: the subscription is paid and the shop is open for changes again.'], p.link);
