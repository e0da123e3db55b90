import { z } from 'zod';
import { listOf, listWithMeta, timestamp } from './envelope';

/** One in-app notice of the signed-in user. */
export const notificationSchema = z.object({
  id: z.string(),
  kind: z.string(),
  title: z.string(),
  body: z.string(),
  jobId: z.string().nullable(),
  readAt: timestamp.nullable(),
  createdAt: timestamp,
});
export type Notification = z.infer<typeof notificationSchema>;

/** `GET /api/notifications`: the user's notices and how many are unread. */
export const notificationsResponseSchema = listWithMeta(notificationSchema, z.object({ total: z.number(), unread: z.number() }));
export type NotificationsResponse = z.infer<typeof notificationsResponseSchema>;

/** One kind of notice and whether the user also gets it by e-mail (`GET`/`PUT /api/notifications/preferences`). */
export const notificationPreferenceSchema = z.object({ kind: z.string(), label: z.string(), email: z.boolean() });
export type NotificationPreference = z.infer<typeof notificationPreferenceSchema>;
export const notificationPreferencesResponseSchema = listOf(notificationPreferenceSchema);
