import type { RequestHandler, Router } from 'express';
import { requireAccess, type Access } from '../middleware/auth';

export type Method = 'get' | 'post' | 'put' | 'patch' | 'delete';

/**
 * Every API route is declared as data, so the access rule sits beside the path and the
 * authorization test can list every route the app serves.
 */
export interface RouteDef {
  method: Method;
  path: string;
  access: Access;
  /** Middleware that runs after the access check and before the handler (uploads). */
  before?: RequestHandler[];
  handler: RequestHandler;
}

export function mount(router: Router, routes: RouteDef[]): void {
  for (const r of routes) router[r.method](r.path, requireAccess(r.access), ...(r.before ?? []), r.handler);
}
