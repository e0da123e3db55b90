import { markNotificationsRead, updateUser, type Db, type UserRow } from '@revloop/db';
import type { AppDeps } from '../../context';
import { parseNotificationPrefs, type NotificationKind, type NotificationPrefs } from './notify.service';

/** Marks the user's notifications in the shop read: the ones named, or all of them. */
export async function markRead({ db, clock }: AppDeps, shopId: string, userId: string, ids?: string[]): Promise<void> {
  await markNotificationsRead(db, shopId, userId, clock.now().toISOString(), ids);
}

/** Merges the changed kinds into the user's e-mail preferences and saves them; returns the full set. */
export async function saveNotificationPrefs(db: Db, user: UserRow, prefs: NotificationPrefs): Promise<Record<NotificationKind, { email: boolean }>> {
  const merged = { ...parseNotificationPrefs(user.notification_prefs), ...prefs };
  await updateUser(db, user.id, { notification_prefs: JSON.stringify(merged) });
  return merged;
}
