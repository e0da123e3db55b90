import { Router } from 'express';
import type { Mailbox } from '../../fakes/smtp/smtp-fake';

/** Development only: the local SMTP stand-in's mailbox, so invitation and reset links can be followed. */
export function createDevRouter(mailbox: Mailbox): Router {
  const router = Router();
  router.get('/mailbox', (_req, res) => {
    const mails = mailbox.list();
    res.json({ data: mails, meta: { total: mails.length } });
  });
  router.delete('/mailbox', (_req, res) => {
    mailbox.clear();
    res.status(204).end();
  });
  return router;
}
