import { currentUser } from '../middleware/auth';
import type { HomeService } from '../services/home';
import type { RouteDef } from './route-table';

export function homeRoutes(home: HomeService): RouteDef[] {
  return [
    { method: 'get', path: '/home', access: 'signed-in', handler: async (req, res) => {
      res.json(await home.forUser(currentUser(req)));
    } },
  ];
}
