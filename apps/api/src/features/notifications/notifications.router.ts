import { Router } from 'express';
import type { Notification, NotificationPreference } from '@revloop/contract';
import { countUnreadNotifications, listNotifications } from '@revloop/db';
import { z } from 'zod';
import type { AppDeps } from '../../context';
import { requireAuth, requireShop } from '../../http/auth-context';
import { parseInput } from '../../http/validate';
import { markRead, saveNotificationPrefs } from './notifications.service';
import { NOTIFICATION_KINDS, NOTIFICATION_LABELS, parseNotificationPrefs } from './notify.service';

const readSchema = z.object({ ids: z.array(z.string().min(1)).max(500).optional() });
const prefsSchema = z.object({
  prefs: z.partialRecord(z.enum(NOTIFICATION_KINDS), z.object({ email: z.boolean() })),
});

export function createNotificationsRouter(deps: AppDeps): Router {
  const { db } = deps;
  const router = Router();

  router.get('/', async (req, res) => {
    const auth = requireShop(req);
    const rows = await listNotifications(db, auth.shop.id, auth.user.id);
    const unread = await countUnreadNotifications(db, auth.shop.id, auth.user.id);
    res.json({
      data: rows.map((r): Notification => ({ id: r.id, kind: r.kind, title: r.title, body: r.body, jobId: r.job_id, readAt: r.read_at, createdAt: r.created_at })),
      meta: { total: rows.length, unread },
    });
  });

  router.post('/read', async (req, res) => {
    const auth = requireShop(req);
    const { ids } = parseInput(readSchema, req.body ?? {});
    await markRead(deps, auth.shop.id, auth.user.id, ids);
    res.json({ data: { unread: await countUnreadNotifications(db, auth.shop.id, auth.user.id) } });
  });

  router.get('/preferences', (req, res) => {
    const auth = requireAuth(req);
    const prefs = parseNotificationPrefs(auth.user.notification_prefs);
    res.json({ data: NOTIFICATION_KINDS.map((kind): NotificationPreference => ({ kind, label: NOTIFICATION_LABELS[kind], email: prefs[kind].email })) });
  });

  router.put('/preferences', async (req, res) => {
    const auth = requireAuth(req);
    const { prefs } = parseInput(prefsSchema, req.body);
    const merged = await saveNotificationPrefs(db, auth.user, prefs);
    res.json({ data: NOTIFICATION_KINDS.map((kind): NotificationPreference => ({ kind, label: NOTIFICATION_LABELS[kind], email: merged[kind].email })) });
  });

  return router;
}
