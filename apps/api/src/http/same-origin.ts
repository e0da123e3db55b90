import type { RequestHandler } from 'express';
import { DomainError } from '@revloop/domain';

const SAFE = new Set(['GET', 'HEAD', 'OPTIONS']);

/**
 * Cross-site request protection for cookie sessions: a state-changing request that a browser marks as
 * cross-site (Sec-Fetch-Site) or that carries a foreign Origin is refused. Requests with neither header
 * come from non-browser clients, which cannot carry a victim's cookie.
 */
export function sameOrigin(allowedOrigins: readonly string[], exemptPaths: readonly string[] = []): RequestHandler {
  return (req, _res, next) => {
    if (SAFE.has(req.method) || exemptPaths.includes(req.path)) return next();
    const site = req.get('sec-fetch-site');
    if (site && site !== 'same-origin' && site !== 'none') {
      return next(new DomainError('forbidden', 'Cross-site request refused.'));
    }
    const origin = req.get('origin');
    if (origin && origin !== 'null') {
      const own = `${req.protocol}://${req.get('host')}`;
      if (origin !== own && !allowedOrigins.includes(origin)) {
        return next(new DomainError('forbidden', 'Cross-site request refused.'));
      }
    } else if (origin === 'null') {
      return next(new DomainError('forbidden', 'Cross-site request refused.'));
    }
    next();
  };
}
