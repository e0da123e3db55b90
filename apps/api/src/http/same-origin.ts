import type { RequestHandler } from 'express';
import { DomainError } from '@revloop/domain';

const SAFE = new Set(['GET', 'HEAD', 'OPTIONS']);

/**
 * Cross-site request protection for cookie sessions: a state-changing request that a browser marks as
 * cross-site (Sec-Fetch-Site) or whose Origin is not one of ours (APP_ORIGIN) is refused. The Host header is
 * never the reference: an attacker's page reaching the app under its own name sends a matching Host and Origin.
 * Requests with neither header come from non-browser clients, which cannot carry a victim's cookie.
 */
export function sameOrigin(allowedOrigins: readonly string[], exemptPaths: readonly string[] = []): RequestHandler {
  return (req, _res, next) => {
    if (SAFE.has(req.method) || exemptPaths.includes(req.path)) return next();
    const site = req.get('sec-fetch-site');
    if (site && site !== 'same-origin' && site !== 'none') {
      return next(new DomainError('forbidden', 'Cross-site request refused.'));
    }
    const origin = req.get('origin');
    if (origin !== undefined && !allowedOrigins.includes(origin)) {
      return next(new DomainError('forbidden', 'Cross-site request refused.'));
    }
    next();
  };
}
