import express, { type Express } from 'express';
import helmet from 'helmet';
import morgan from 'morgan';
import type { Sequelize } from 'sequelize';
import type { Config } from './config';
import { apiNotFound, errorHandler } from './middleware/error';
import { createRegistry, generateDocument } from './openapi';
import { healthRouter, registerHealthDocs } from './routes/health';
import { webRouter } from './web';

export type AppDeps = {
  config: Config;
  sequelize: Sequelize;
  logError?: (err: unknown) => void;
};

export function createApp({ config, sequelize, logError = console.error }: AppDeps): Express {
  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', 'loopback');
  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: {
          defaultSrc: ["'self'"],
          scriptSrc: ["'self'", "'wasm-unsafe-eval'"],
          // react-native-web injects its styles at run time.
          styleSrc: ["'self'", "'unsafe-inline'"],
          imgSrc: ["'self'", 'data:', 'blob:'],
          fontSrc: ["'self'", 'data:'],
          connectSrc: ["'self'"],
          objectSrc: ["'none'"],
          frameAncestors: ["'none'"],
          upgradeInsecureRequests: null,
        },
      },
    }),
  );
  if (config.logRequests) app.use(morgan(config.env === 'production' ? 'combined' : 'dev'));

  const docs = createRegistry();
  const api = express.Router();
  api.use(express.json({ limit: '1mb' }));
  api.use(healthRouter({ sequelize, version: config.version, dbTimeoutMs: config.dbTimeoutMs }));
  registerHealthDocs(docs);

  const openapi = generateDocument(docs, config.version);
  api.get('/openapi.json', (_req, res) => {
    res.json(openapi);
  });
  api.use(apiNotFound);

  app.use('/api', api);
  app.use(webRouter(config.webDir));
  app.use(errorHandler(logError));
  return app;
}
