import { Router } from 'express';
import { fleetQuerySchema } from '@kerfline/domain/fleet/schema';
import { budgetParamsSchema, budgetPutSchema } from '@kerfline/domain/budgets/schema';
import { abilityOf, actorOf } from '../../http/authenticate.js';
import { parsed, validate } from '../../http/validate.js';
import { sendCsv } from '../../http/csv.js';
import { assertExportable, money } from '../fleet/fleet-csv.js';
import { deleteBudget, getBudgetStatus, putBudget } from './budgets.service.js';

export function budgetsRouter(): Router {
  const router = Router();
  router.get('/budgets', validate('query', fleetQuerySchema), async (_req, res) => {
    res.json(await getBudgetStatus(abilityOf(res), parsed(res, 'query', fleetQuerySchema)));
  });
  router.get('/budgets/export', validate('query', fleetQuerySchema), async (_req, res) => {
    const q = parsed(res, 'query', fleetQuerySchema);
    const status = await getBudgetStatus(abilityOf(res), q);
    assertExportable(
      abilityOf(res),
      status.sites.map((s) => s.site),
    );
    await sendCsv(res, `budgets-${q.from}-${q.to}`, {
      header: [
        'Site code',
        'Site',
        'Month',
        'Currency',
        'Budget',
        'Spend',
        'Spend complete',
        'Variance',
        'Used (%)',
        'Projected',
      ],
      rows: status.sites.flatMap((s) =>
        s.months.map((m) => [
          s.site.code,
          s.site.name,
          m.month,
          s.site.currency,
          m.budget ? money(m.budget.amountMinor, s.site.currency) : null,
          money(m.spentMinor, s.site.currency),
          m.spendComplete,
          money(m.varianceMinor, s.site.currency),
          m.percentUsed,
          money(m.projectedMinor, s.site.currency),
        ]),
      ),
    });
  });
  router.put(
    '/budgets/:siteId/:month',
    validate('params', budgetParamsSchema),
    validate('body', budgetPutSchema),
    async (_req, res) => {
      const { siteId, month } = parsed(res, 'params', budgetParamsSchema);
      res.json(await putBudget(actorOf(res), siteId, month, parsed(res, 'body', budgetPutSchema).amountMinor));
    },
  );
  router.delete('/budgets/:siteId/:month', validate('params', budgetParamsSchema), async (_req, res) => {
    const { siteId, month } = parsed(res, 'params', budgetParamsSchema);
    await deleteBudget(actorOf(res), siteId, month);
    res.status(204).end();
  });
  return router;
}
