import { Router as ExpressRouter, type RequestHandler, type Router } from 'express';
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

/**
 * Mounts the routes. Routes whose paths begin with the same plain word (`/templates/…`) go into one
 * sub-router mounted at that word, in their order: a request is then matched against the few
 * sub-routers and the routes of its own word instead of every route before it. No two words can
 * match the same path, so which route answers a request does not change.
 */
export function mount(router: Router, routes: RouteDef[]): void {
  const groups = new Map<string, Router>();
  for (const r of routes) {
    const word = /^\/([a-z][a-z-]*)(\/.*)?$/.exec(r.path);
    let target: Router = router;
    let path = r.path;
    if (word) {
      let sub = groups.get(word[1]!);
      if (!sub) {
        sub = ExpressRouter();
        groups.set(word[1]!, sub);
        router.use(`/${word[1]}`, sub);
      }
      target = sub;
      path = word[2] ?? '/';
    }
    target[r.method](path, requireAccess(r.access), ...(r.before ?? []), r.handler);
  }
}
