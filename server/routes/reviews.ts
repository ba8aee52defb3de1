import { CAN } from '../../shared/schemas/auth';
import { z } from 'zod';
import { IdParamSchema, ROW_ID_MAX, TOO_LARGE_ID } from '../../shared/schemas/common';
import { currentUser } from '../middleware/auth';
import type { ReviewsService } from '../services/reviews';
import { parseOr400 } from './parse';
import type { RouteDef } from './route-table';

const VersionParamsSchema = IdParamSchema.extend({ n: z.coerce.number({ message: 'The version number in the address must be a whole number.' }).int().positive().max(ROW_ID_MAX, TOO_LARGE_ID) });
const CommentSchema = z.object({ comment: z.string().trim().max(4000, 'Comments are limited to 4,000 characters.').default('') });
const ChangesSchema = z.object({ comment: z.string({ message: 'Say what to change: a comment is required.' }).trim().min(3, 'Say what to change: a comment is required.').max(4000) });
const DiffQuerySchema = z.object({
  from: z.coerce.number({ message: 'from must be a version number.' }).int().positive('from must be a version number.').max(ROW_ID_MAX, TOO_LARGE_ID),
  to: z.coerce.number({ message: 'to must be a version number.' }).int().positive('to must be a version number.').max(ROW_ID_MAX, TOO_LARGE_ID),
});

// Each step's route admits the roles the lifecycle table (shared/review/lifecycle.ts) names for it;
// the table then decides on the version's state and refuses an author signing off their own version.
export function reviewRoutes(reviews: ReviewsService): RouteDef[] {
  const params = (p: unknown) => parseOr400(VersionParamsSchema, p, 'address');
  return [
    { method: 'post', path: '/templates/:id/versions/:n/submit', access: CAN.editTemplates, handler: async (req, res) => {
      const { id, n } = params(req.params);
      res.json(await reviews.submit(currentUser(req), id, n));
    } },
    { method: 'post', path: '/templates/:id/versions/:n/approve', access: CAN.signOff, handler: async (req, res) => {
      const { id, n } = params(req.params);
      res.json(await reviews.approve(currentUser(req), id, n, parseOr400(CommentSchema, req.body ?? {}, 'approval').comment));
    } },
    { method: 'post', path: '/templates/:id/versions/:n/request-changes', access: CAN.signOff, handler: async (req, res) => {
      const { id, n } = params(req.params);
      res.json(await reviews.requestChanges(currentUser(req), id, n, parseOr400(ChangesSchema, req.body ?? {}, 'change request').comment));
    } },
    { method: 'post', path: '/templates/:id/versions/:n/retire', access: CAN.releaseTemplates, handler: async (req, res) => {
      const { id, n } = params(req.params);
      res.json(await reviews.retire(currentUser(req), id, n));
    } },
    { method: 'get', path: '/templates/:id/versions/:n/reviews', access: 'signed-in', handler: async (req, res) => {
      const { id, n } = params(req.params);
      const items = await reviews.reviews(id, n);
      res.json({ items, total: items.length });
    } },
    { method: 'get', path: '/templates/:id/diff', access: 'signed-in', handler: async (req, res) => {
      const { id } = parseOr400(IdParamSchema, req.params, 'address');
      const { from, to } = parseOr400(DiffQuerySchema, req.query, 'query');
      res.json(await reviews.diff(id, from, to));
    } },
  ];
}
