import { CAN } from '../../shared/schemas/auth';
import { AuditQuerySchema } from '../../shared/schemas/audit';
import type { AuditRepo } from '../db/audit-repo';
import { parseOr400 } from './parse';
import type { RouteDef } from './route-table';

export function auditRoutes(audit: AuditRepo): RouteDef[] {
  return [
    { method: 'get', path: '/audit', access: CAN.readAudit, handler: async (req, res) => {
      res.json(await audit.list(parseOr400(AuditQuerySchema, req.query, 'query')));
    } },
  ];
}
