import type { RequestHandler } from 'express';
import { inShopScope, outsideShopScope, type Db } from '@revloop/db';

/**
 * Runs the rest of a request of a signed-in shop member in that shop's scope (inShopScope): on PostgreSQL, row-level
 * security then hides every other shop's rows from all its queries, so a repository query that forgot its shop filter
 * still reads and writes only this shop. Requests without a shop (signed out, platform admin, a user between shops)
 * run unscoped, as does work a shop request marks with outsideShopScope (the list is in docs/decisions/013).
 */
export function shopScopeMiddleware(db: Db): RequestHandler {
  return (req, _res, next) => {
    const shopId = req.auth?.shop?.id;
    if (!shopId) return next();
    inShopScope(db, shopId, next);
  };
}

/** Runs the rest of the request unscoped (outsideShopScope): for routes that are no one shop's work. */
export function unscopedRoutes(db: Db): RequestHandler {
  return (_req, _res, next) => outsideShopScope(db, next);
}
