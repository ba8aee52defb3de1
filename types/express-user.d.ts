import type { User as GridsetUser } from '../shared/schemas/auth';

declare global {
  namespace Express {
    // passport puts the signed-in user (as loaded by the users repository) on req.user
    interface User extends GridsetUser {}
  }
}
export {};
