import type { RequestHandler } from 'express';
import type { Role, User } from '../../shared/schemas/auth';
import { HttpError } from './errors';

/** Who may call a route: anyone, any signed-in user, or the listed roles. */
export type Access = 'public' | 'signed-in' | readonly Role[];

export function requireAccess(access: Access): RequestHandler {
  return (req, _res, next) => {
    if (access === 'public') return next();
    const user = req.user as User | undefined;
    if (!user) throw new HttpError(401, 'unauthenticated', 'Sign in first.');
    if (access !== 'signed-in' && !access.includes(user.role)) {
      throw new HttpError(403, 'forbidden', `Your role (${user.role}) may not do this; it takes ${access.join(' or ')}.`);
    }
    next();
  };
}

export function currentUser(req: Express.Request): User {
  const user = req.user as User | undefined;
  if (!user) throw new HttpError(401, 'unauthenticated', 'Sign in first.');
  return user;
}
