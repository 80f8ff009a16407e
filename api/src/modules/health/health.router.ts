import type { Sequelize } from 'sequelize';
import type { ApiRoutes } from '../../routing.ts';

/** GET /api/health: 200 when PostgreSQL answers, 503 when it does not. */
export function registerHealthRoutes(routes: ApiRoutes, deps: { sequelize: Sequelize; version: string }) {
  routes.get('/health', { access: 'public' }, async (_req, res) => {
    const started = performance.now();
    try {
      await deps.sequelize.query('SELECT 1');
      res.json({ status: 'ok', database: 'reachable', databaseMs: Math.round((performance.now() - started) * 10) / 10, version: deps.version });
    } catch {
      res.status(503).json({ status: 'degraded', database: 'unreachable', version: deps.version });
    }
  });
}
