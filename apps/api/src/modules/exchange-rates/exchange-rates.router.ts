import { Router } from 'express';
import {
  exchangeRateParamsSchema,
  exchangeRatePutSchema,
  exchangeRatesQuerySchema,
  reportingCurrencyPutSchema,
} from '@kerfline/domain/money/schema';
import { abilityOf, actorOf } from '../../http/authenticate.js';
import { parsed, validate } from '../../http/validate.js';
import {
  deleteExchangeRate,
  listExchangeRates,
  putExchangeRate,
  putReportingCurrency,
} from './exchange-rates.service.js';

export function exchangeRatesRouter(): Router {
  const router = Router();
  router.get('/exchange-rates', validate('query', exchangeRatesQuerySchema), async (_req, res) => {
    res.json(await listExchangeRates(abilityOf(res), parsed(res, 'query', exchangeRatesQuerySchema)));
  });
  router.put(
    '/exchange-rates/:currency/:month',
    validate('params', exchangeRateParamsSchema),
    validate('body', exchangeRatePutSchema),
    async (_req, res) => {
      const { currency, month } = parsed(res, 'params', exchangeRateParamsSchema);
      res.json(await putExchangeRate(actorOf(res), currency, month, parsed(res, 'body', exchangeRatePutSchema).rate));
    },
  );
  router.delete('/exchange-rates/:currency/:month', validate('params', exchangeRateParamsSchema), async (_req, res) => {
    const { currency, month } = parsed(res, 'params', exchangeRateParamsSchema);
    await deleteExchangeRate(actorOf(res), currency, month);
    res.status(204).end();
  });
  router.put('/reporting-currency', validate('body', reportingCurrencyPutSchema), async (_req, res) => {
    res.json(await putReportingCurrency(actorOf(res), parsed(res, 'body', reportingCurrencyPutSchema).currency));
  });
  return router;
}
