import { Router } from 'express';
import { sequelize } from '../../models/index.ts';
import { APP_VERSION } from '../../version.ts';
import type { Health } from '../../../shared/schemas/health.ts';

export const healthRouter = Router();

healthRouter.get('/', async (_req, res) => {
  let db: 'up' | 'down' = 'up';
  try {
    await sequelize.authenticate();
  } catch {
    db = 'down';
  }
  const body: Health = { ok: db === 'up', db, version: APP_VERSION };
  res.status(db === 'up' ? 200 : 503).json(body);
});
