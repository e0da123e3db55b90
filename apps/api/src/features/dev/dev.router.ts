import { Router } from 'express';
import type { Mail } from '@revloop/contract';
import { DomainError } from '@revloop/domain';
import type { Mailbox } from '@revloop/stand-ins/smtp';

/**
 * The local SMTP stand-in's mailbox, so invitation and reset links can be followed in development and the demo.
 * It holds password-reset links, so only a signed-in platform admin reaches it; everyone else gets the same 404
 * as a route that does not exist (docs/decisions/006).
 */
export function createDevRouter(mailbox: Mailbox): Router {
  const router = Router();
  router.use('/mailbox', (req, _res, next) => {
    const action = req.method === 'DELETE' ? 'delete' : 'read';
    if (!req.auth?.ability.can(action, 'Mailbox')) return next(new DomainError('not_found', 'No such API route.'));
    next();
  });
  router.get('/mailbox', (_req, res) => {
    const mails: Mail[] = mailbox.list();
    res.json({ data: mails, meta: { total: mails.length } });
  });
  router.delete('/mailbox', (_req, res) => {
    mailbox.clear();
    res.status(204).end();
  });
  return router;
}
