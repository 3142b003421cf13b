import express, { type Express } from 'express';
import helmet from 'helmet';
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { sessionMiddleware } from './auth/session';
import type { AppContext } from './context';
import { authRoutes } from './features/auth/routes';
import { boardRoutes } from './features/boards/routes';
import { ensureDictionary } from './features/diagnosis';
import { captureRoutes } from './features/capture/routes';
import { customerRoutes } from './features/customers/routes';
import { diagnosisRoutes } from './features/diagnosis/routes';
import { jobRoutes } from './features/jobs/routes';
import { readingRoutes } from './features/readings/routes';
import { repairRoutes } from './features/repairs/routes';
import { reportRoutes } from './features/reports';
import { reviewRoutes } from './features/reviews/routes';
import { uploadRoutes } from './features/uploads/routes';
import { referenceRoutes } from './features/references/routes';
import { userRoutes } from './features/users/routes';
import { billingRoutes } from './features/billing/routes';
import { invoiceRoutes, paymentWebhookRoutes } from './features/invoices';
import { mailOutboxRoutes } from './features/mail';
import { quoteRoutes } from './features/quotes';
import { dutyRoutes } from './features/duties/routes';
import { customerPortalRoutes } from './features/customer-portal/routes';
import { healthRoutes } from './features/health/routes';
import { shopRoutes } from './features/shops/routes';
import { boardHistoryRoutes } from './features/board-history';
import { serviceTermsRoutes } from './features/service-terms';
import { partsBinRoutes } from './features/parts-bin';
import { meterImportRoutes } from './features/meter-import';
import { shopStatsRoutes } from './features/shop-stats';
import { benchMeterRoutes } from './features/bench-meter';
import { errorHandler, notFoundApi } from './http/errors';
import { hostAllowList } from './http/host';
import { originCheck } from './http/origin';

/** Builds the Express app; `main.ts` listens, the integration tests call it in-process. */
export function createApp(ctx: AppContext): Express {
  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', 'loopback');
  app.use(hostAllowList({ publicUrl: ctx.config.PUBLIC_URL, host: ctx.config.HOST }));
  // Over plain HTTP (a shop's LAN address) `upgrade-insecure-requests` would send every script to an https port
  // nobody serves, and HSTS would lock the name to https: both only when the public address is https.
  const https = ctx.config.PUBLIC_URL?.startsWith('https://') ?? false;
  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: {
          'img-src': ["'self'", 'data:', 'blob:'],
          'script-src': ["'self'"],
          'style-src': ["'self'", "'unsafe-inline'"],
          'upgrade-insecure-requests': https ? [] : null,
        },
      },
      strictTransportSecurity: https,
    }),
  );

  // The payment webhook reads its raw body (the signature covers the bytes), so it sits ahead of the JSON parser.
  app.use('/api/webhooks/payments', paymentWebhookRoutes(ctx));
  const api = express.Router();
  api.use(express.json({ limit: '1mb' }));
  api.use(originCheck(ctx.config.PUBLIC_URL));
  // API answers are for the person who asked, at that moment: no browser or proxy keeps them (uploads set their own).
  api.use((_req, res, next) => {
    res.setHeader('Cache-Control', 'no-store');
    next();
  });
  api.use(healthRoutes(ctx));
  api.use(customerPortalRoutes(ctx));
  api.use(sessionMiddleware(ctx.auth));
  // A published version's fault dictionary is built in the background; the version is usable at once.
  const buildDictionary = (versionId: string) =>
    void ensureDictionary(ctx.db, versionId).catch((err: unknown) =>
      console.error(`splitscope: fault dictionary of ${versionId} not started: ${(err as Error).message}`),
    );
  // The signed-in API, mounted in this order. First the readings: a reading write is the busiest request, and
  // every router ahead of it is tried in turn.
  const signedIn: ((c: AppContext) => express.Router)[] = [
    readingRoutes,
    authRoutes,
    shopRoutes,
    userRoutes,
    customerRoutes,
    captureRoutes,
    (c) => boardRoutes(c, buildDictionary),
    jobRoutes,
    diagnosisRoutes,
    reviewRoutes,
    repairRoutes,
    reportRoutes,
    uploadRoutes,
    referenceRoutes,
    // Billing: settings, quotes, invoices, status e-mails and the development outbox.
    billingRoutes,
    quoteRoutes,
    invoiceRoutes,
    mailOutboxRoutes,
    dutyRoutes,
    serviceTermsRoutes,
    boardHistoryRoutes,
    partsBinRoutes,
    meterImportRoutes,
    shopStatsRoutes,
    benchMeterRoutes,
  ];
  for (const routes of signedIn) api.use(routes(ctx));
  api.use(notFoundApi);
  app.use('/api', api);

  const dist = ctx.config.WEB_DIST;
  if (dist && existsSync(join(dist, 'index.html'))) {
    app.use(express.static(dist, { index: false, maxAge: '1h' }));
    // Client-side routes all load the SPA shell.
    app.get('/{*splat}', (_req, res) => res.sendFile(join(dist, 'index.html')));
  }
  app.use(errorHandler);
  return app;
}
