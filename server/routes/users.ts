import { CAN, CreateUserInputSchema, UpdateUserInputSchema } from '../../shared/schemas/auth';
import { IdParamSchema } from '../../shared/schemas/common';
import { currentUser } from '../middleware/auth';
import { validationError } from '../middleware/errors';
import type { UsersService } from '../services/users';
import type { RouteDef } from './route-table';

export function userRoutes(users: UsersService): RouteDef[] {
  return [
    {
      method: 'get',
      path: '/users',
      access: CAN.manageUsers,
      handler: async (_req, res) => {
        const items = await users.list();
        res.json({ items, total: items.length });
      },
    },
    {
      method: 'post',
      path: '/users',
      access: CAN.manageUsers,
      handler: async (req, res) => {
        const parsed = CreateUserInputSchema.safeParse(req.body);
        if (!parsed.success) throw validationError(parsed.error, 'new user');
        res.status(201).json(await users.create(currentUser(req), parsed.data));
      },
    },
    {
      method: 'patch',
      path: '/users/:id',
      access: CAN.manageUsers,
      handler: async (req, res) => {
        const id = IdParamSchema.safeParse(req.params);
        if (!id.success) throw validationError(id.error, 'address');
        const parsed = UpdateUserInputSchema.safeParse(req.body);
        if (!parsed.success) throw validationError(parsed.error, 'user change');
        res.json(await users.update(currentUser(req), id.data.id, parsed.data));
      },
    },
  ];
}
