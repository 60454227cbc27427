import compression from 'compression';
import cookieParser from 'cookie-parser';
import express, { type Express } from 'express';
import helmet from 'helmet';
import morgan from 'morgan';
import type { Sequelize } from 'sequelize';
import type { Config } from './config';
import { contentSecurityPolicy } from './csp';
import type { Mailer } from './mail/sender';
import { authenticate } from './middleware/auth';
import { refuseOtherBodyTypes } from './middleware/body-type';
import { apiNotFound, errorHandler, type ErrorContext } from './middleware/error';
import { publicOriginOnly } from './middleware/origin';
import { assignRequestId } from './middleware/request-id';
import { createRegistry, generateDocument } from './openapi';
import type { PasswordHasher } from './passwords/hasher';
import { createPhotoStore } from './photos/configured-store';
import type { PhotoStore } from './photos/store';
import { authRouter, registerAuthDocs } from './routes/auth';
import { batchesRouter, registerBatchDocs } from './routes/batches';
import { burnTestsRouter, registerBurnDocs } from './routes/burn-tests';
import { criteriaProfilesRouter, registerCriteriaDocs } from './routes/criteria-profiles';
import { devMailRouter } from './routes/dev-mail';
import { healthRouter, registerHealthDocs } from './routes/health';
import { invitationsRouter, registerInvitationDocs } from './routes/invitations';
import { labsRouter, registerLabDocs } from './routes/labs';
import { meRouter, registerMeDocs } from './routes/me';
import { pairImportsRouter, registerPairImportDocs } from './routes/pair-imports';
import { rankingsRouter, registerRankingDocs } from './routes/rankings';
import { recipesRouter, registerRecipeDocs } from './routes/recipes';
import { registerTreatmentDocs, treatmentsRouter } from './routes/treatments';
import type { ServiceDeps } from './services/deps';
import { webRouter } from './web';

export type AppDeps = {
  config: Config;
  sequelize: Sequelize;
  hasher: PasswordHasher;
  mailer: Mailer;
  /** Defaults to the store the config names; the runtime passes its own so it can close it. */
  photoStore?: PhotoStore;
  logError?: (err: unknown, context: ErrorContext) => void;
};

export function createApp({
  config,
  sequelize,
  hasher,
  mailer,
  photoStore = createPhotoStore(config.photos),
  logError = console.error,
}: AppDeps): Express {
  const deps: ServiceDeps = { config, hasher, mailer };
  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', 'loopback');
  app.use(assignRequestId);
  app.use(
    helmet({
      contentSecurityPolicy: {
        useDefaults: false,
        directives: contentSecurityPolicy,
      },
    }),
  );
  // Bundles (~1.8 MB of JavaScript) and fonts arrive at about a quarter of their size on a
  // phone; answers already encoded (the ranking is stored gzipped) pass through untouched.
  app.use(compression());
  if (config.logRequests) app.use(morgan(config.env === 'production' ? 'combined' : 'dev'));
  app.use(cookieParser());

  const docs = createRegistry();
  const api = express.Router();
  api.use(publicOriginOnly(config.publicUrl));
  api.use(refuseOtherBodyTypes());
  api.use(express.json({ limit: '1mb' }));
  api.use(healthRouter({ sequelize, version: config.version, dbTimeoutMs: config.dbTimeoutMs }));
  registerHealthDocs(docs);
  api.use(authRouter(deps));
  registerAuthDocs(docs);
  api.use(meRouter(deps));
  registerMeDocs(docs);
  api.use(invitationsRouter(deps));
  registerInvitationDocs(docs);
  // Everything under /labs needs a signed-in caller; each route then checks the lab and role.
  api.use('/labs', authenticate(config));
  api.use(labsRouter(deps));
  registerLabDocs(docs);
  api.use(recipesRouter());
  registerRecipeDocs(docs);
  api.use(batchesRouter());
  registerBatchDocs(docs);
  api.use(burnTestsRouter(photoStore));
  registerBurnDocs(docs);
  api.use(rankingsRouter());
  registerRankingDocs(docs);
  api.use(treatmentsRouter());
  registerTreatmentDocs(docs);
  api.use(criteriaProfilesRouter());
  registerCriteriaDocs(docs);
  api.use(pairImportsRouter());
  registerPairImportDocs(docs);

  const openapi = generateDocument(docs, config.version);
  api.get('/openapi.json', (_req, res) => {
    res.json(openapi);
  });

  // Development only: the mail the local fake SMTP server captured. Never in production.
  if (config.env !== 'production' && config.mail.fakeSmtp) {
    app.use(devMailRouter(config.mail.fakeSmtp.mailboxDir));
  }
  api.use(apiNotFound);
  app.use('/api', api);
  app.use(webRouter(config.webDir));
  app.use(errorHandler(logError));
  return app;
}
