import { findUserById, insertNotifications, newId, type Db } from '@revloop/db';
import { queueMail } from '../mail/mail-outbox.service';
import type { OutgoingMail } from '../mail/mailer';

/** The moves that reach people; each user may turn the e-mail of any kind off (in-app stays). */
export const NOTIFICATION_KINDS = ['job_received', 'revision_ready', 'log_received', 'job_dialed_in', 'message_received', 'job_moved', 'kit_rental'] as const;
export type NotificationKind = (typeof NOTIFICATION_KINDS)[number];

export const NOTIFICATION_LABELS: Record<NotificationKind, string> = {
  job_received: 'A job is received',
  revision_ready: 'A revision is ready',
  log_received: 'A log is received',
  job_dialed_in: 'A job is dialed in',
  message_received: 'A message arrives',
  job_moved: 'A job changes state',
  kit_rental: 'A rented kit ships, is due or is overdue',
};

/** Which kinds mail by default: everything but the routine state changes. */
const EMAIL_BY_DEFAULT: Record<NotificationKind, boolean> = {
  job_received: true,
  revision_ready: true,
  log_received: true,
  job_dialed_in: true,
  message_received: true,
  job_moved: false,
  kit_rental: true,
};

export type NotificationPrefs = Partial<Record<NotificationKind, { email: boolean }>>;

export function parseNotificationPrefs(json: string): Record<NotificationKind, { email: boolean }> {
  let stored: NotificationPrefs;
  try {
    stored = JSON.parse(json) as NotificationPrefs;
  } catch {
    stored = {};
  }
  return Object.fromEntries(
    NOTIFICATION_KINDS.map((kind) => [kind, { email: stored[kind]?.email ?? EMAIL_BY_DEFAULT[kind] }]),
  ) as Record<NotificationKind, { email: boolean }>;
}

export interface Notice {
  shopId: string;
  jobId: string | null;
  kind: NotificationKind;
  recipients: string[];
  title: string;
  body: string;
  /** Extra lines for the e-mail only (cautions, log request). */
  emailLines?: string[];
  link: string;
  at: Date;
}

/**
 * Writes an in-app notification for every recipient and queues an e-mail to those whose preference allows it. Call
 * it in the transaction of the change it reports, then `drainMailOutbox` after the commit.
 */
export async function notify(db: Db, notice: Notice, exceptUserId?: string | null): Promise<void> {
  const recipients = [...new Set(notice.recipients)].filter((id) => id && id !== exceptUserId);
  await insertNotifications(
    db,
    recipients.map((userId) => ({
      id: newId(),
      shop_id: notice.shopId,
      user_id: userId,
      job_id: notice.jobId,
      kind: notice.kind,
      title: notice.title,
      body: notice.body,
      read_at: null,
      created_at: notice.at.toISOString(),
    })),
  );
  const mails: OutgoingMail[] = [];
  for (const userId of recipients) {
    const user = await findUserById(db, userId);
    if (!user || !parseNotificationPrefs(user.notification_prefs)[notice.kind].email) continue;
    const lines = [notice.body, ...(notice.emailLines ?? []), '', `Open it in Revloop: ${notice.link}`, '', '— Revloop'];
    mails.push({ to: user.email, subject: notice.title, text: lines.join('\n') });
  }
  await queueMail(db, mails, notice.at);
}
