import { Router } from 'express';
import { z } from 'zod';
import { userCreateSchema, userListQuerySchema, userUpdateSchema } from '@kerfline/domain/users/schema';
import { idSchema } from '@kerfline/domain/common/schema';
import { abilityOf, actorOf } from '../../http/authenticate.js';
import { parsed, validate } from '../../http/validate.js';
import { createUser, getUser, listUsers, setUserActive, updateUser } from './users.service.js';

const params = z.object({ id: idSchema });

export function usersRouter(): Router {
  const router = Router();
  router.get('/users', validate('query', userListQuerySchema), async (_req, res) => {
    res.json(await listUsers(abilityOf(res), parsed(res, 'query', userListQuerySchema)));
  });
  router.get('/users/:id', validate('params', params), async (_req, res) => {
    res.json(await getUser(abilityOf(res), parsed(res, 'params', params).id));
  });
  router.post('/users', validate('body', userCreateSchema), async (_req, res) => {
    res.status(201).json(await createUser(actorOf(res), parsed(res, 'body', userCreateSchema)));
  });
  router.patch('/users/:id', validate('params', params), validate('body', userUpdateSchema), async (_req, res) => {
    res.json(await updateUser(actorOf(res), parsed(res, 'params', params).id, parsed(res, 'body', userUpdateSchema)));
  });
  router.post('/users/:id/deactivate', validate('params', params), async (_req, res) => {
    res.json(await setUserActive(actorOf(res), parsed(res, 'params', params).id, false));
  });
  router.post('/users/:id/reactivate', validate('params', params), async (_req, res) => {
    res.json(await setUserActive(actorOf(res), parsed(res, 'params', params).id, true));
  });
  return router;
}
