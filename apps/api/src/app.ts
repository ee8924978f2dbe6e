// Builds the Express application from its dependencies. No side effects: nothing listens,
// nothing connects; server.ts and the tests do that.
import { randomUUID } from 'node:crypto';
import { existsSync } from 'node:fs';
import path from 'node:path';
import compression from 'compression';
import cookieParser from 'cookie-parser';
import express, { type Express } from 'express';
import helmet from 'helmet';
import { pinoHttp } from 'pino-http';
import { OpenAPIRegistry } from '@asteasolutions/zod-to-openapi';
import { redactUrl } from './lib/redact';
import { useMailSecretKey } from './mail/secret-data';
import { useMailSender } from './mail/sender';
import { ApiRouter } from './lib/api-router';
import { apiNotFound, problemDetails } from './middleware/problem-details';
import { precompressedStatic, sendPage } from './middleware/precompressed-static';
import { createGuards } from './middleware/auth';
import { createLimiters } from './middleware/rate-limits';
import { createStorage } from './storage';
import { createPaymentGateway } from './payments/gateway';
import { registerAccountRoutes } from './routes/account.routes';
import { registerAdminRoutes } from './routes/admin.routes';
import { registerAuthRoutes } from './routes/auth.routes';
import { registerCatalogueRoutes } from './routes/catalogue.routes';
import { registerTeamRoutes } from './routes/team.routes';
import { registerVehicleRoutes } from './routes/vehicle.routes';
import { registerHealthRoutes } from './routes/health.routes';
import { registerOnboardingRoutes } from './routes/onboarding.routes';
import { registerOfferRoutes } from './routes/offers.routes';
import { registerPartnerRoutes } from './routes/partners.routes';
import { registerReviewRoutes } from './routes/review.routes';
import { registerSearchRoutes } from './routes/search.routes';
import { registerEligibilityRuleRoutes } from './routes/eligibility-rules.routes';
import { registerBookingRoutes } from './routes/bookings.routes';
import { registerPaymentWebhook } from './routes/payments.routes';
import { docsRouter } from './routes/docs.routes';
import type { AppContext, AppDeps } from './app-context';

export interface EmberlineApp extends Express {
  /** The OpenAPI registry every route was declared in (tests enumerate it). */
  readonly openApiRegistry: OpenAPIRegistry;
}

function serveApps(app: Express, appsDir: string): void {
  const directoryHtml = path.join(appsDir, 'index.html');
  const consoleHtml = path.join(appsDir, 'apps/console/index.html');
  if (!existsSync(directoryHtml)) {
    app.get(/^\/(?!api\/).*/, (_req, res) => {
      res.status(503).type('text/plain').send('The apps are not built yet. Run "npm run build", or use "npm start", which builds them.');
    });
    return;
  }
  // a missing or malformed asset name is a plain 404: the file system's error names server paths
  const notFound: express.RequestHandler = (_req, res) => {
    res.status(404).type('text/plain').send('Not found');
  };
  // hashed names change with their content, so a year is safe; the pages naming them are revalidated
  app.use('/assets', precompressedStatic(path.join(appsDir, 'assets'), { immutable: true, maxAge: '1y' }), notFound);
  app.use(precompressedStatic(appsDir, { maxAge: '1h' }));
  const spa = (file: string): express.RequestHandler => (req, res, next) => {
    if (req.method !== 'GET' && req.method !== 'HEAD') return next();
    sendPage(req, res, file, () => {
      if (!res.headersSent) notFound(req, res, next);
    });
  };
  app.get(/^\/console(\/.*)?$/, spa(consoleHtml));
  app.get(/^\/(?!api(\/|$)).*/, spa(directoryHtml));
}

export function createApp(deps: AppDeps): EmberlineApp {
  const app = express() as unknown as EmberlineApp & { openApiRegistry: OpenAPIRegistry };
  app.disable('x-powered-by');
  app.set('trust proxy', deps.config.TRUST_PROXY);
  // HTTPS-only headers make sense only where the public URL is HTTPS (production behind TLS)
  const https = deps.config.publicUrl.startsWith('https:');
  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: {
          'img-src': ["'self'", 'data:', 'blob:'],
          'connect-src': ["'self'"],
          // the Console shows a partner's PDF papers from an object URL (fetched with the bearer token)
          'frame-src': ["'self'", 'blob:'],
          // No stylesheet comes from elsewhere, so no https:. 'unsafe-inline' stays: ant-design-vue's CSS-in-JS
          // injects <style> elements, which 'self' alone blocks (the Console loses its styles), and in 4.2 its
          // component style hooks never pass ConfigProvider's `csp` nonce on; the styles depend on the theme, so
          // hashes would break with every token change. Dropping it means extracting the styles at build time.
          'style-src': ["'self'", "'unsafe-inline'"],
          'upgrade-insecure-requests': https ? [] : null,
        },
      },
      strictTransportSecurity: https,
    }),
  );
  app.use(
    pinoHttp({
      logger: deps.logger,
      genReqId: (req, res) => {
        const incoming = req.headers['x-request-id'];
        const id = typeof incoming === 'string' && /^[\w-]{8,64}$/.test(incoming) ? incoming : randomUUID();
        res.setHeader('x-request-id', id);
        return id;
      },
      autoLogging: { ignore: (req) => req.url === '/api/health' },
      // one short line per request: no headers (they carry tokens and cookies)
      serializers: {
        req: (req: { id: string; method: string; url: string }) => ({ id: req.id, method: req.method, url: redactUrl(req.url) }),
        res: (res: { statusCode: number }) => ({ statusCode: res.statusCode }),
      },
    }),
  );

  const registry = new OpenAPIRegistry();
  app.openApiRegistry = registry;
  useMailSecretKey(deps.dataSource, deps.jwtSecret);
  useMailSender(deps.dataSource, deps.config.MAIL_FROM);

  const context: AppContext = {
    ...deps,
    storage: deps.storage ?? createStorage(deps.config),
    payments: deps.payments ?? createPaymentGateway(deps.config),
    authSettings: {
      jwtSecret: deps.jwtSecret,
      accessTtlSeconds: deps.config.ACCESS_TOKEN_TTL_SECONDS,
      refreshTtlDays: deps.config.REFRESH_TOKEN_TTL_DAYS,
      passwordHashCost: deps.config.PASSWORD_HASH_COST,
      publicUrl: deps.config.publicUrl,
    },
    limiters: createLimiters({ dataSource: deps.dataSource, logger: deps.logger, scope: deps.limitScope }, deps.limits),
    guards: createGuards(deps.dataSource, deps.jwtSecret),
  };
  const api = new ApiRouter(registry, '/api', context.guards);
  // the webhook reads its body raw (the signature covers the bytes): before the JSON parser
  registerPaymentWebhook(api, context);
  api.router.use(express.json({ limit: '1mb' }));
  api.router.use(cookieParser());
  registerHealthRoutes(api, context);
  registerCatalogueRoutes(api, context);
  registerAuthRoutes(api, context);
  registerAccountRoutes(api, context);
  registerVehicleRoutes(api, context);
  registerTeamRoutes(api, context);
  registerAdminRoutes(api, context);
  registerOnboardingRoutes(api, context);
  registerReviewRoutes(api, context);
  registerPartnerRoutes(api, context);
  registerOfferRoutes(api, context);
  registerSearchRoutes(api, context);
  registerEligibilityRuleRoutes(api, context);
  registerBookingRoutes(api, context);
  api.router.use(docsRouter(registry, deps.version));
  api.router.use(apiNotFound);

  // JSON answers compress well (the OpenAPI document to about a tenth); the API streams no events that a buffer would hold up
  app.use('/api', compression(), api.router);
  if (deps.config.SERVE_APPS) serveApps(app, deps.config.APPS_DIR);
  app.use(problemDetails);
  return app;
}
