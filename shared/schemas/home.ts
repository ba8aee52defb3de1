import { z } from 'zod';
import { AuditEntrySchema } from './audit';
import { CAN, RoleSchema, type Role } from './auth';
import { ChangesRequestedSchema, VersionStatusSchema } from './template-api';

// GET /api/home: what waits for the signed-in person, by role. A section the role does not get is
// null (not an empty list), so the screen can tell "nothing waits" from "not yours".

/** A version in review that this person may sign off (not one they wrote). */
export const HomeReviewSchema = z.object({
  templateId: z.number().int(),
  templateName: z.string(),
  version: z.number().int(),
  plateCode: z.string(),
  placements: z.number().int(),
  /** The version to read it against (shared/review/lifecycle.ts compareBase); null for a first version. */
  compareFrom: z.number().int().nullable(),
  submittedBy: z.string().nullable(),
  submittedAt: z.string().nullable(),
});
export type HomeReview = z.infer<typeof HomeReviewSchema>;

/** A draft this person started: plain, or sent back with the reviewer's comment. */
export const HomeDraftSchema = z.object({
  templateId: z.number().int(),
  templateName: z.string(),
  version: z.number().int(),
  status: VersionStatusSchema,
  updatedAt: z.string(),
  changesRequested: ChangesRequestedSchema.nullable(),
  compareFrom: z.number().int().nullable(),
});
export type HomeDraft = z.infer<typeof HomeDraftSchema>;

export const HomeJobSchema = z.object({
  id: z.number().int(),
  name: z.string(),
  partNumber: z.string(),
  templateId: z.number().int(),
  templateName: z.string(),
  version: z.number().int(),
  /** The latest released version of the template when it is newer than the pinned one. */
  newerRelease: z.number().int().nullable(),
});
export type HomeJob = z.infer<typeof HomeJobSchema>;

export const HomeAuditLineSchema = AuditEntrySchema.pick({ id: true, at: true, userEmail: true, action: true, objectType: true, objectId: true, summary: true });
export type HomeAuditLine = z.infer<typeof HomeAuditLineSchema>;

export const HomeSchema = z.object({
  role: RoleSchema,
  reviews: z.array(HomeReviewSchema).nullable(),
  drafts: z.array(HomeDraftSchema).nullable(),
  jobsBehind: z.array(HomeJobSchema).nullable(),
  jobsUnchecked: z.array(HomeJobSchema).nullable(),
  audit: z.array(HomeAuditLineSchema).nullable(),
});
export type Home = z.infer<typeof HomeSchema>;
export type HomeSection = Exclude<keyof Home, 'role'>;

/** How many recent audit lines the home shows; the Audit page has the rest. */
export const HOME_AUDIT_LINES = 10;

/**
 * Which lists a role's home holds, from the roles table: reviews for those who sign off, drafts for
 * those who edit templates, jobs on an older release for those who edit jobs, jobs without a stock
 * check for those who record bars, recent audit lines for those who read the audit.
 */
export function homeSections(role: Role): Record<HomeSection, boolean> {
  return {
    reviews: CAN.signOff.includes(role),
    drafts: CAN.editTemplates.includes(role),
    jobsBehind: CAN.editJobs.includes(role),
    jobsUnchecked: CAN.recordBars.includes(role),
    audit: CAN.readAudit.includes(role),
  };
}
