import { Router } from 'express';
import type { Sequelize } from 'sequelize';

/** 200 when the database answers, 503 when it does not; load balancers use it to take a process out. */
export function healthRouter(sequelize: Sequelize): Router {
  const router = Router();
  router.get('/health', async (_req, res) => {
    try {
      await sequelize.query('SELECT 1');
      res.json({ status: 'ok', database: 'reachable' });
    } catch {
      res.status(503).json({ error: { code: 'UNAVAILABLE', message: 'The database is not reachable' } });
    }
  });
  return router;
}
