import { Router } from 'express';
import type { Sequelize } from 'sequelize';
import { userCreateSchema, userListQuerySchema } from '@kerfline/domain/users/schema';
import { abilityOf } from '../../http/authenticate.js';
import { parsed, validate } from '../../http/validate.js';
import { createUser, listUsers } from './users.service.js';

export function usersRouter(sequelize: Sequelize): Router {
  const router = Router();
  router.get('/users', validate('query', userListQuerySchema), async (_req, res) => {
    res.json(await listUsers(abilityOf(res), parsed(res, 'query', userListQuerySchema)));
  });
  router.post('/users', validate('body', userCreateSchema), async (_req, res) => {
    res.status(201).json(await createUser(sequelize, abilityOf(res), parsed(res, 'body', userCreateSchema)));
  });
  return router;
}
