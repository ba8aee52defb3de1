import { checkStock } from '../../shared/clamps/stock-check';
import { StockCheckRequestSchema } from '../../shared/schemas/stock-check';
import { parseOr400 } from './parse';
import type { RouteDef } from './route-table';

/** The clamp-window check as a pure computation: any signed-in role, writes nothing. */
export function stockCheckRoutes(): RouteDef[] {
  return [
    { method: 'post', path: '/stock-check', access: 'signed-in', handler: (req, res) => {
      res.json(checkStock(parseOr400(StockCheckRequestSchema, req.body, 'stock check')));
    } },
  ];
}
