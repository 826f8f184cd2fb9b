import { Router, type RequestHandler } from 'express';
import multer from 'multer';
import { z } from 'zod';
import { idSchema } from '@kerfline/domain/common/schema';
import { detailsFromZodError } from '@kerfline/domain/errors';
import {
  importContextQuerySchema,
  importListQuerySchema,
  importPlanSchema,
  type ImportPlan,
} from '@kerfline/domain/imports/schema';
import { abilityOf, actorOf } from '../../http/authenticate.js';
import { parsed, validate } from '../../http/validate.js';
import { AppError } from '../../errors.js';
import { unreadableForm } from '../../http/multipart.js';
import {
  checkImport,
  commitImport,
  getImport,
  getImportContext,
  listImports,
  rejectedRowsCsv,
  tooLarge,
  undoImport,
  type ImportLimits,
  type ReceivedFile,
} from './imports.service.js';

const params = z.object({ id: idSchema });

/** One file in the form field `file` (at most IMPORT_MAX_BYTES, held in memory) and the plan as JSON in `plan`. */
function receiveFile(limits: ImportLimits): RequestHandler {
  const upload = multer({
    storage: multer.memoryStorage(),
    limits: { fileSize: limits.maxBytes, files: 1, fields: 2, fieldSize: 1024 * 1024 },
  }).single('file');
  return (req, res, next) => {
    upload(req, res, (err: unknown) => {
      if (err instanceof multer.MulterError) {
        if (err.code === 'LIMIT_FILE_SIZE') return next(tooLarge(limits));
        return next(
          AppError.validation('Send one file in the form field "file" and the mapping in "plan"', [
            { path: err.field ?? 'file', message: err.message },
          ]),
        );
      }
      next(err ? unreadableForm(err, 'the file') : undefined);
    });
  };
}

/** The received file and the parsed plan; a missing file or a plan that does not parse is a 400 in words. */
function fileAndPlan(req: Parameters<RequestHandler>[0]): { file: ReceivedFile; plan: ImportPlan } {
  if (!req.file) throw AppError.validation('Choose a file to bring in', [{ path: 'file', message: 'is required' }]);
  const body = (req.body ?? {}) as { plan?: unknown };
  let raw: unknown;
  try {
    raw = JSON.parse(typeof body.plan === 'string' ? body.plan : '');
  } catch {
    throw AppError.validation('The mapping (plan) must be sent as JSON', [{ path: 'plan', message: 'is required' }]);
  }
  const plan = importPlanSchema.safeParse(raw);
  if (!plan.success)
    throw AppError.validation(
      'The column mapping needs fixing',
      detailsFromZodError(plan.error).map((d) => ({ ...d, path: `plan.${d.path}` })),
    );
  // Browsers send the name in Latin-1 bytes through multer; names are read back as UTF-8. Control characters
  // (U+0000 among them, which PostgreSQL's text cannot hold) are left out: a name is shown, never run.
  const fileName =
    Buffer.from(req.file.originalname, 'latin1')
      .toString('utf8')
      .replace(/\p{Cc}/gu, '')
      .slice(0, 255) || 'file';
  return { file: { bytes: req.file.buffer, fileName }, plan: plan.data };
}

export function importsRouter(limits: ImportLimits): Router {
  const router = Router();
  router.get('/imports/context', validate('query', importContextQuerySchema), async (_req, res) => {
    res.json(await getImportContext(abilityOf(res), parsed(res, 'query', importContextQuerySchema), limits));
  });
  router.get('/imports', validate('query', importListQuerySchema), async (_req, res) => {
    res.json(await listImports(abilityOf(res), parsed(res, 'query', importListQuerySchema)));
  });
  router.post('/imports/check', receiveFile(limits), async (req, res) => {
    const { file, plan } = fileAndPlan(req);
    res.json(await checkImport(abilityOf(res), file, plan, limits));
  });
  router.post('/imports', receiveFile(limits), async (req, res) => {
    const { file, plan } = fileAndPlan(req);
    res.status(201).json(await commitImport(actorOf(res), file, plan, limits));
  });
  router.get('/imports/:id', validate('params', params), async (_req, res) => {
    res.json(await getImport(abilityOf(res), parsed(res, 'params', params).id));
  });
  router.get('/imports/:id/rejected.csv', validate('params', params), async (_req, res) => {
    const { fileName, csv } = await rejectedRowsCsv(abilityOf(res), parsed(res, 'params', params).id);
    res.setHeader('Content-Type', 'text/csv; charset=utf-8');
    res.setHeader('Content-Disposition', `attachment; filename="${fileName}"`);
    res.send(csv);
  });
  router.post('/imports/:id/undo', validate('params', params), async (_req, res) => {
    res.json(await undoImport(actorOf(res), parsed(res, 'params', params).id));
  });
  return router;
}
