import express, { Router, type Express } from 'express';
import { rateLimit } from 'express-rate-limit';
import { DbRateLimitStore } from './http/rate-limit-store';
import { datalogAnalyzerOf } from './features/datalogs/datalog.service';
import { registerMailOutboxJob } from './features/mail/mail-outbox.service';
import helmet from 'helmet';
import fs from 'node:fs';
import path from 'node:path';
import { pinoHttp } from 'pino-http';
import { DomainError } from '@revloop/domain';
import { pingDb } from '@revloop/db';
import type { AppDeps } from './context';
import { createAdminRouter } from './features/admin/admin.router';
import { createAuditRouter } from './features/audit/audit.router';
import { createAuthRouter } from './features/auth/auth.router';
import { usePasswordHashCost } from './features/auth/password';
import { sessionPolicyOf, secureCookiesOf } from './features/auth/start-session';
import { createBillingRouter } from './features/billing/billing.router';
import { createStripeWebhookRouter } from './features/billing/stripe-webhook.router';
import { createDatalogsRouter, createJobDatalogsRouter } from './features/datalogs/datalogs.router';
import { createDealersRouter } from './features/dealers/dealers.router';
import { createDevRouter } from './features/dev/dev.router';
import { createFilesRouter, createJobFilesRouter } from './features/files/files.router';
import { createInvitationsRouter } from './features/invitations/invitations.router';
import { createMeRouter } from './features/me/me.router';
import { createMembersRouter } from './features/members/members.router';
import { createCustomersRouter } from './features/customers/customers.router';
import { createJobsRouter } from './features/jobs/jobs.router';
import { createKitsRouter } from './features/kits/kits.router';
import { createRentalsRouter } from './features/rentals/rentals.router';
import { createNotificationsRouter } from './features/notifications/notifications.router';
import { createPublicRouter } from './features/public/public.router';
import { createPackagesRouter } from './features/packages/packages.router';
import { createReportsRouter } from './features/reports/reports.router';
import { createShopRouter } from './features/shop/shop.router';
import { createVehiclesRouter } from './features/vehicles/vehicles.router';
import { sessionMiddleware } from './http/auth-context';
import { errorHandler } from './http/error-handler';
import { sameOrigin } from './http/same-origin';
import { shopScopeMiddleware, unscopedRoutes } from './http/shop-scope';

/** Builds the app without listening, so tests drive it with supertest. */
export function createApp(deps: AppDeps): Express {
  usePasswordHashCost(deps.env);
  // The queue's handlers exist before any request or start-up recovery queues work.
  datalogAnalyzerOf(deps);
  registerMailOutboxJob(deps);
  const app = express();
  app.disable('x-powered-by');
  if (deps.env.TRUST_PROXY) app.set('trust proxy', deps.env.TRUST_PROXY);
  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: {
          defaultSrc: ["'self'"],
          // Charts set inline style attributes; scripts stay self-only.
          styleSrc: ["'self'", "'unsafe-inline'"],
          imgSrc: ["'self'", 'data:', 'blob:'],
          connectSrc: ["'self'"],
          upgradeInsecureRequests: null,
        },
      },
      strictTransportSecurity: deps.env.APP_ORIGIN.startsWith('https:'),
    }),
  );
  app.use(pinoHttp({ logger: deps.logger, autoLogging: deps.env.NODE_ENV !== 'test' }));

  const api = Router();
  // The webhook verifies its signature over the raw body, so it is mounted before the JSON parser (and needs no session).
  api.use('/stripe', createStripeWebhookRouter(deps));
  api.use(express.json({ limit: '1mb' }));
  api.get('/health', (_req, res) => {
    res.json({ status: 'ok' });
  });
  // Readiness for a load balancer: this instance reaches its database (liveness is /health, which touches nothing).
  api.get('/health/ready', async (_req, res) => {
    const database = await pingDb(deps.db);
    res.status(database === 'unreachable' ? 503 : 200).json({ status: database === 'unreachable' ? 'unavailable' : 'ok', database });
  });
  api.use(sameOrigin([deps.env.APP_ORIGIN]));
  api.use(
    sessionMiddleware({
      db: deps.db,
      clock: deps.clock,
      policy: sessionPolicyOf(deps.env),
      secureCookies: secureCookiesOf(deps.env),
    }),
  );
  // From here on a shop member's request runs in its shop's scope: PostgreSQL row-level security guards every query.
  api.use(shopScopeMiddleware(deps.db));
  // No one shop's work, so unscoped even for a signed-in member: signing in or up (into any shop), another shop's
  // public page (by its slug), the platform admin's pages over every shop.
  api.use(['/auth', '/public', '/admin'], unscopedRoutes(deps.db));
  api.use((req, res, next) => {
    // Signed-in answers are one person's data: no shared cache or back-button copy may keep them.
    if (req.auth) res.set('Cache-Control', 'no-store');
    next();
  });
  const accountLimiter = rateLimit({
    windowMs: 15 * 60_000,
    limit: deps.env.NODE_ENV === 'test' ? 1000 : 50,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    // Counted in the database, so two instances behind a load balancer share one budget per address.
    store: new DbRateLimitStore(deps.db, 'account:', () => deps.clock.now().getTime()),
    handler: (_req, _res, next) => next(new DomainError('rate_limited', 'Too many requests from this address. Try again later.')),
  });
  api.use(['/auth/sign-up', '/auth/password-reset', '/public/shops/:slug/start', '/public/shops/:slug/verify'], accountLimiter);
  api.use('/auth', createAuthRouter(deps));
  api.use('/public', createPublicRouter(deps));
  api.use('/me', createMeRouter(deps));
  api.use('/invitations', createInvitationsRouter(deps));
  api.use('/members', createMembersRouter(deps));
  api.use('/dealers', createDealersRouter(deps));
  api.use('/admin', createAdminRouter(deps));
  api.use('/audit', createAuditRouter(deps));
  api.use('/shop', createShopRouter(deps));
  api.use('/jobs', createJobsRouter(deps));
  api.use('/vehicles', createVehiclesRouter(deps));
  api.use('/packages', createPackagesRouter(deps));
  api.use('/customers', createCustomersRouter(deps));
  api.use('/reports', createReportsRouter(deps));
  api.use('/notifications', createNotificationsRouter(deps));
  api.use('/kits', createKitsRouter(deps));
  api.use('/rentals', createRentalsRouter(deps));
  api.use('/files', createFilesRouter(deps));
  api.use('/jobs/:jobId/files', createJobFilesRouter(deps));
  api.use('/datalogs', createDatalogsRouter(deps));
  api.use('/jobs/:jobId/datalogs', createJobDatalogsRouter(deps));
  api.use('/billing', createBillingRouter(deps));
  if (deps.mailbox) api.use('/dev', createDevRouter(deps.mailbox));
  api.use((_req, _res, next) => next(new DomainError('not_found', 'No such API route.')));
  app.use('/api', api);

  const webDist = deps.env.WEB_DIST_DIR;
  if (webDist && fs.existsSync(path.join(webDist, 'index.html'))) {
    app.use(express.static(webDist, { index: false, maxAge: '1h' }));
    app.get('/{*path}', (_req, res) => {
      res.sendFile(path.join(webDist, 'index.html'));
    });
  }

  app.use(errorHandler);
  return app;
}
