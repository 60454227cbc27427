import { Router } from 'express';
import type { Sequelize } from 'sequelize';
import { healthSchema, type Health } from '../../shared/schemas/health';
import { databaseIsUp } from '../db';
import type { ApiDocs } from '../openapi';

export function healthRouter(deps: {
  sequelize: Sequelize;
  version: string;
  dbTimeoutMs: number;
}): Router {
  const router = Router();
  router.get('/health', async (_req, res) => {
    const up = await databaseIsUp(deps.sequelize, deps.dbTimeoutMs);
    const body: Health = {
      status: up ? 'ok' : 'degraded',
      db: up ? 'ok' : 'down',
      version: deps.version,
    };
    res.status(up ? 200 : 503).json(body);
  });
  return router;
}

export function registerHealthDocs(docs: ApiDocs): void {
  docs.registerPath({
    method: 'get',
    path: '/api/health',
    summary: 'Liveness and database reachability',
    responses: {
      200: {
        description: 'Server and database are up',
        content: { 'application/json': { schema: healthSchema } },
      },
      503: {
        description: 'The database does not answer',
        content: { 'application/json': { schema: healthSchema } },
      },
    },
  });
}
