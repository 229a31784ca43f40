import fs from 'node:fs';
import path from 'node:path';
import express, { type Express, type RequestHandler } from 'express';
import session from 'express-session';
import cookieParser from 'cookie-parser';
import helmet from 'helmet';
import connectSessionSequelize from 'connect-session-sequelize';
import { createPassport } from './auth/passport';
import type { AppDeps } from './deps';
import { createCsrf } from './middlewares/csrf';
import { apiNotFound, errorHandler } from './middlewares/error-handler';
import { createAttemptLimiter, createInvitationLimiter, createSignInLimiters, createSignUpLimiters } from './middlewares/rate-limit';
import { requestLog } from './middlewares/request-log';
import { sessionGuard } from './middlewares/session-guard';
import { createThumbnailPool, type Thumbnailer } from './services/thumbnails';
import { readOnlyGuard } from './middlewares/read-only-guard';
import { billingRouter } from './routes/billing/router';
import { stripeWebhookRouter } from './routes/webhooks/router';
import { clientsRouter } from './routes/clients/router';
import { publicFirmsRouter } from './routes/public-firms/router';
import { portalRouter } from './routes/portal/router';
import { clientInvitationsRouter } from './routes/client-invitations/router';
import { contactsRouter } from './routes/contacts/router';
import { documentsRouter } from './routes/documents/router';
import { firmRouter } from './routes/firm/router';
import { upkeepSettingsRouter } from './routes/firm/upkeep';
import { checklistTemplatesRouter } from './routes/firm/checklists';
import { panelsRouter } from './routes/panels/router';
import { premisesRouter } from './routes/premises/router';
import { sitesRouter } from './routes/sites/router';
import { zonesRouter } from './routes/zones/router';
import { invitationsRouter } from './routes/invitations/router';
import { jobsRouter } from './routes/jobs/router';
import { operatorRouter } from './routes/operator/router';
import { operatorRevenueRouter } from './routes/operator/revenue';
import { firmBusinessRouter } from './routes/firm/business';
import { sessionRouter } from './routes/session/router';
import { staffRouter } from './routes/staff/router';

const SequelizeStore = connectSessionSequelize(session.Store);
const SESSION_DAYS = 14;

export interface CreatedApp {
  app: Express;
  /** stops the session store's timer and the thumbnail workers; call at shutdown and in test teardown */
  close: () => Promise<void>;
}

/** What createApp needs; without `thumbnails` it starts its own pool (one worker, on first use). */
export type AppInput = Omit<AppDeps, 'thumbnails'> & { thumbnails?: Thumbnailer | undefined };

export function createApp(input: AppInput): CreatedApp {
  const deps: AppDeps = { ...input, thumbnails: input.thumbnails ?? createThumbnailPool() };
  const app = express();
  app.disable('x-powered-by');
  // Only TRUST_PROXY decides whether X-Forwarded-For is believed (default: not at all), so
  // a forged header cannot change the address that attempt limits count.
  app.set('trust proxy', deps.trustProxy ?? false);

  // First: every request gets an id (echoed in X-Request-Id) and one log line when it ends.
  app.use(requestLog(deps.logger));
  app.use(
    helmet({
      contentSecurityPolicy: {
        useDefaults: false,
        directives: {
          defaultSrc: ["'self'"],
          baseUri: ["'self'"],
          connectSrc: ["'self'"],
          fontSrc: ["'self'"],
          formAction: ["'self'"],
          frameAncestors: ["'none'"],
          imgSrc: ["'self'", 'data:', 'blob:'],
          objectSrc: ["'none'"],
          scriptSrc: ["'self'"],
          scriptSrcAttr: ["'none'"],
          styleSrc: ["'self'"],
          ...(deps.secureCookies ? { upgradeInsecureRequests: [] } : {}),
        },
      },
      strictTransportSecurity: deps.secureCookies,
    }),
  );

  // Health answers before sessions: load balancers do not need one.
  app.get('/api/health', async (_req, res) => {
    try {
      await deps.sequelize.query('SELECT 1');
      res.json({ ok: true });
    } catch {
      res.status(503).json({ ok: false });
    }
  });

  // Our Session model (server/models/Session.ts) adds userId to the store's columns.
  const store = new SequelizeStore({
    db: deps.sequelize,
    table: 'Session',
    expiration: SESSION_DAYS * 24 * 60 * 60 * 1000,
    checkExpirationInterval: 15 * 60 * 1000,
    extendDefaultFields: (defaults: { data: string; expires: Date }, sess: { passport?: { user?: string } }) => ({
      data: defaults.data,
      expires: defaults.expires,
      userId: sess.passport?.user ?? null,
    }),
  });

  const passport = createPassport();
  const csrf = createCsrf(deps.sessionSecret, deps.secureCookies);

  // Stripe signs the raw body and sends no session: its endpoint comes before the JSON parser and CSRF.
  app.use('/api', stripeWebhookRouter(deps));
  app.use('/api', express.json({ limit: '200kb' }));
  app.use('/api', cookieParser());
  app.use(
    '/api',
    session({
      name: deps.secureCookies ? '__Host-mullion.sid' : 'mullion.sid',
      secret: deps.sessionSecret,
      store,
      resave: false,
      saveUninitialized: false,
      rolling: true,
      cookie: { httpOnly: true, sameSite: 'lax', secure: deps.secureCookies, maxAge: SESSION_DAYS * 24 * 60 * 60 * 1000, path: '/' },
    }),
  );
  app.use('/api', passport.session() as RequestHandler);
  // Order on a state-changing request: CSRF, then authentication, then authorization.
  app.use('/api', csrf.protect);
  app.use('/api', sessionGuard);
  app.use('/api', readOnlyGuard(deps));

  // Attempt limits. No published source fixes these numbers: they are common practice for a
  // small-firm service, chosen so a person who mistypes is never stopped while a script is.
  // NIST SP 800-63B §5.2.2 asks that consecutive failed sign-ins to one account be limited to
  // at most 100; the per-address limit below allows 100 failures a day and is cleared by the
  // right password or a password reset.
  const MINUTE = 60 * 1000;
  const HOUR = 60 * MINUTE;
  const limits = deps.rateLimits ?? {};
  const signIn = createSignInLimiters({
    perAddressFromIp: limits.signIn ?? { limit: 10, windowMs: 15 * MINUTE },
    perIp: limits.signInPerIp ?? { limit: 30, windowMs: 15 * MINUTE },
    perAccount: limits.signInPerAccount ?? { limit: 100, windowMs: 24 * HOUR },
  });
  const resetLimiter = createAttemptLimiter(limits.passwordReset ?? { limit: 5, windowMs: 15 * MINUTE });
  const signUpLimiters = createSignUpLimiters({
    perIp: limits.signUpPerIp ?? { limit: 10, windowMs: HOUR },
    perAddress: limits.signUpPerAddress ?? { limit: 3, windowMs: HOUR },
  });
  const invitationLimiter = createInvitationLimiter(limits.invitationsPerUser ?? { limit: 60, windowMs: HOUR });

  app.use('/api', sessionRouter(deps, { passport, csrf, signIn, resetLimiter, signUpLimiters }));
  app.use('/api', invitationsRouter(deps));
  app.use('/api', publicFirmsRouter(deps));
  app.use('/api', staffRouter(deps, { invitationLimiter }));
  app.use('/api', upkeepSettingsRouter(deps));
  app.use('/api', checklistTemplatesRouter(deps));
  app.use('/api', firmRouter(deps));
  app.use('/api', billingRouter(deps));
  app.use('/api', firmBusinessRouter(deps));
  app.use('/api', operatorRouter(deps));
  app.use('/api', operatorRevenueRouter(deps));
  app.use('/api', clientInvitationsRouter(deps, { invitationLimiter }));
  app.use('/api', portalRouter(deps));
  app.use('/api', clientsRouter(deps));
  app.use('/api', sitesRouter(deps));
  app.use('/api', contactsRouter(deps));
  app.use('/api', documentsRouter(deps));
  app.use('/api', panelsRouter(deps));
  app.use('/api', zonesRouter(deps));
  app.use('/api', premisesRouter(deps));
  app.use('/api', jobsRouter(deps));
  app.use('/api', apiNotFound);
  app.use('/api', errorHandler(deps.logger));

  if (deps.serveClient) serveClient(app, deps.serveClient);

  return {
    app,
    async close() {
      store.stopExpiringSessions();
      await deps.thumbnails.close();
    },
  };
}

/** Serves the built client: hashed assets cached long, every other path gets index.html. */
function serveClient(app: Express, dist: string): void {
  const index = path.join(dist, 'index.html');
  app.use('/assets', express.static(path.join(dist, 'assets'), { immutable: true, maxAge: '365d', index: false }));
  app.use(express.static(dist, { index: false, maxAge: '1h' }));
  app.get('/{*splat}', (_req, res, next) => {
    if (!fs.existsSync(index)) return next();
    res.set('Cache-Control', 'no-cache');
    res.sendFile(index);
  });
}
