import { CAN } from '../../shared/schemas/auth';
import { ListQuerySchema } from '../../shared/schemas/common';
import type { OutboxRepo } from '../db/outbox-repo';
import { parseOr400 } from './parse';
import type { RouteDef } from './route-table';

export function outboxRoutes(outbox: OutboxRepo): RouteDef[] {
  return [
    {
      method: 'get',
      path: '/outbox',
      access: CAN.readOutbox,
      handler: async (req, res) => {
        res.json(await outbox.list(parseOr400(ListQuerySchema, req.query, 'query')));
      },
    },
  ];
}
