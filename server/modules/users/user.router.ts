import { z } from 'zod';
import {
  createUserInputSchema,
  newPasswordSchema,
  resetPasswordInputSchema,
  updateUserInputSchema,
  uuidParamSchema,
} from '../../../shared/schemas/auth.schema';
import type { ApiRoutes } from '../../lib/routes';
import { actorOf } from '../auth/auth.router';
import { validate } from '../../middleware/validate';
import type { UserService } from './user.service';
import { toUserDto } from './user.service';

export const changeOwnPasswordSchema = z.object({
  currentPassword: z.string().min(1, 'Enter your current password'),
  newPassword: newPasswordSchema,
});

export function registerUserRoutes(api: ApiRoutes, users: UserService) {
  api.get('/users', ['admin'], async (_req, res) => {
    res.json({ items: await users.list() });
  });

  api.post('/users', ['admin'], validate(createUserInputSchema), async (req, res) => {
    res.status(201).json(await users.create(req.body, actorOf(req), req.ip ?? null));
  });

  api.get('/users/:id', ['admin'], validate(uuidParamSchema, 'params'), async (req, res) => {
    res.json(toUserDto(await users.get(String(req.params.id))));
  });

  api.patch('/users/:id', ['admin'], validate(uuidParamSchema, 'params'), validate(updateUserInputSchema), async (req, res) => {
    res.json(await users.update(String(req.params.id), req.body, actorOf(req), req.ip ?? null));
  });

  api.post('/users/:id/password', ['admin'], validate(uuidParamSchema, 'params'), validate(resetPasswordInputSchema), async (req, res) => {
    await users.resetPassword(String(req.params.id), req.body.password, actorOf(req), req.ip ?? null);
    res.status(204).end();
  });

  api.post('/me/password', 'signed-in', validate(changeOwnPasswordSchema), async (req, res) => {
    await users.changeOwnPassword(req.user!, req.body.currentPassword, req.body.newPassword, req.ip ?? null, req.sessionID);
    res.status(204).end();
  });
}
