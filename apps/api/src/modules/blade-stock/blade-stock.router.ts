import { Router } from 'express';
import { z } from 'zod';
import {
  siteStockQuerySchema,
  stockLevelsInputSchema,
  stockMovementExportQuerySchema,
  stockMovementListQuerySchema,
  stockReceiptCreateSchema,
  stockReceiptListQuerySchema,
  stockReceiptUpdateSchema,
} from '@kerfline/domain/blade-stock/schema';
import { idSchema } from '@kerfline/domain/common/schema';
import { abilityOf, actorOf } from '../../http/authenticate.js';
import { parsed, validate } from '../../http/validate.js';
import {
  createStockReceipt,
  deleteStockReceipt,
  getSiteStock,
  getStockReceipt,
  listStockMovements,
  listStockReceipts,
  putStockLevels,
  updateStockReceipt,
} from './blade-stock.service.js';
import { exportName, exportScope, streamListCsv } from '../records/record-export.js';
import { STOCK_MOVEMENT_HEADER, stockMovementCells } from '../records/record-csv.js';

const params = z.object({ id: idSchema });
const levelParams = z.object({ id: idSchema, bladeSpecId: idSchema });

export function bladeStockRouter(): Router {
  const router = Router();
  router.get('/stock-receipts', validate('query', stockReceiptListQuerySchema), async (_req, res) => {
    res.json(await listStockReceipts(abilityOf(res), parsed(res, 'query', stockReceiptListQuerySchema)));
  });
  router.get('/stock-receipts/:id', validate('params', params), async (_req, res) => {
    res.json(await getStockReceipt(abilityOf(res), parsed(res, 'params', params).id));
  });
  router.post('/stock-receipts', validate('body', stockReceiptCreateSchema), async (_req, res) => {
    res.status(201).json(await createStockReceipt(actorOf(res), parsed(res, 'body', stockReceiptCreateSchema)));
  });
  router.patch(
    '/stock-receipts/:id',
    validate('params', params),
    validate('body', stockReceiptUpdateSchema),
    async (_req, res) => {
      const { id } = parsed(res, 'params', params);
      res.json(await updateStockReceipt(actorOf(res), id, parsed(res, 'body', stockReceiptUpdateSchema)));
    },
  );
  router.delete('/stock-receipts/:id', validate('params', params), async (_req, res) => {
    await deleteStockReceipt(actorOf(res), parsed(res, 'params', params).id);
    res.status(204).end();
  });
  router.get(
    '/sites/:id/stock',
    validate('params', params),
    validate('query', siteStockQuerySchema),
    async (_req, res) => {
      const { id } = parsed(res, 'params', params);
      res.json(await getSiteStock(abilityOf(res), id, parsed(res, 'query', siteStockQuerySchema)));
    },
  );
  router.get(
    '/sites/:id/stock/movements',
    validate('params', params),
    validate('query', stockMovementListQuerySchema),
    async (_req, res) => {
      const { id } = parsed(res, 'params', params);
      res.json(await listStockMovements(abilityOf(res), id, parsed(res, 'query', stockMovementListQuerySchema)));
    },
  );
  router.get(
    '/sites/:id/stock/movements/export',
    validate('params', params),
    validate('query', stockMovementExportQuerySchema),
    async (_req, res) => {
      const ability = abilityOf(res);
      const { id } = parsed(res, 'params', params);
      const filters = parsed(res, 'query', stockMovementExportQuerySchema);
      const scope = await exportScope(ability, id);
      await streamListCsv(
        res,
        exportName(scope, 'stock-movements'),
        STOCK_MOVEMENT_HEADER,
        (limit, offset) => listStockMovements(ability, id, { ...filters, limit, offset }),
        stockMovementCells,
      );
    },
  );
  router.put(
    '/sites/:id/stock/:bladeSpecId/levels',
    validate('params', levelParams),
    validate('body', stockLevelsInputSchema),
    async (_req, res) => {
      const { id, bladeSpecId } = parsed(res, 'params', levelParams);
      res.json(await putStockLevels(actorOf(res), id, bladeSpecId, parsed(res, 'body', stockLevelsInputSchema)));
    },
  );
  return router;
}
