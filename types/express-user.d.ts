import type { User as GridsetUser } from '../shared/schemas/auth';

declare global {
  namespace Express {
    // passport puts the signed-in user (as loaded by the users repository) on req.user
    // eslint-disable-next-line @typescript-eslint/no-empty-object-type -- declaration merging into Express.User needs an interface
    interface User extends GridsetUser {}
  }
}
export {};
