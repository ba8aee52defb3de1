import type { User } from '../../shared/schemas/auth';
import { HOME_AUDIT_LINES, homeSections, type Home, type HomeDraft, type HomeJob, type HomeReview } from '../../shared/schemas/home';
import { compareBase } from '../../shared/review/lifecycle';
import type { AuditRepo } from '../db/audit-repo';
import type { JobRow, JobsRepo } from '../db/jobs-repo';
import type { ReviewsRepo } from '../db/reviews-repo';
import type { TemplatesRepo } from '../db/templates-repo';
import { isoTime, toNumber } from '../db/dialect';
import type { TemplatesService } from './templates';

/**
 * "What waits for me?": the lists of one person's home, each built only for the roles that get it
 * (shared/schemas/home.ts homeSections). Reads only; newest first within each list.
 */
export function homeService(deps: { templates: TemplatesService; templatesRows: TemplatesRepo; jobs: JobsRepo; reviews: ReviewsRepo; audit: AuditRepo }) {
  const { templates, templatesRows, jobs, reviews, audit } = deps;

  async function versionLists(user: User, want: { reviews: boolean; drafts: boolean }) {
    const [rows, steps] = await Promise.all([templatesRows.list(), reviews.lastSteps()]);
    const waiting: HomeReview[] = [];
    const drafts: HomeDraft[] = [];
    for (const { t, versions } of rows) {
      for (const v of versions) {
        const last = steps.get(v.id);
        const compareFrom = compareBase(versions, v.number);
        // The author may not sign off their own version, so it does not wait for them.
        if (want.reviews && v.state === 'in-review' && v.author_id !== user.id) {
          // Only a submission puts a version in review, so its latest step says who sent it and when.
          waiting.push({ templateId: t.id, templateName: t.name, version: v.number, plateCode: t.plate_code, placements: toNumber(v.placement_count), compareFrom, submittedBy: last?.by ?? null, submittedAt: last?.at ?? isoTime(v.updated_at) });
        }
        if (want.drafts && v.state === 'draft' && v.author_id === user.id) {
          drafts.push({ templateId: t.id, templateName: t.name, version: v.number, updatedAt: isoTime(v.updated_at), compareFrom, ...templates.reviewMark(v.state, last) });
        }
      }
    }
    // Sent back first (someone waits on the author), then the most recently touched.
    drafts.sort((a, b) => Number(b.status === 'changes-requested') - Number(a.status === 'changes-requested') || b.updatedAt.localeCompare(a.updatedAt));
    // Oldest submission first: it has waited longest.
    waiting.sort((a, b) => (a.submittedAt ?? '').localeCompare(b.submittedAt ?? ''));
    return { waiting, drafts };
  }

  return {
    async forUser(user: User): Promise<Home> {
      const want = homeSections(user.role);
      const lists = want.reviews || want.drafts ? await versionLists(user, want) : null;
      let jobsBehind: HomeJob[] | null = null;
      let jobsUnchecked: HomeJob[] | null = null;
      if (want.jobsBehind || want.jobsUnchecked) {
        const [rows, latest, checked] = await Promise.all([jobs.list(), jobs.latestReleases(), jobs.checkedJobIds()]);
        const line = (r: JobRow): HomeJob => {
          const newest = latest.get(r.template_id) ?? null;
          return { id: r.id, name: r.name, partNumber: r.part_number, templateId: r.template_id, templateName: r.template_name, version: r.number, newerRelease: newest !== null && newest > r.number ? newest : null };
        };
        const all = rows.map(line);
        if (want.jobsBehind) jobsBehind = all.filter((j) => j.newerRelease !== null);
        if (want.jobsUnchecked) jobsUnchecked = all.filter((j) => !checked.has(j.id));
      }
      const auditLines = want.audit
        ? (await audit.list({ limit: HOME_AUDIT_LINES, offset: 0 })).items.map(({ id, at, userEmail, action, objectType, objectId, summary }) => ({ id, at, userEmail, action, objectType, objectId, summary }))
        : null;
      return {
        role: user.role,
        reviews: want.reviews ? lists!.waiting : null,
        drafts: want.drafts ? lists!.drafts : null,
        jobsBehind, jobsUnchecked,
        audit: auditLines,
      };
    },
  };
}
export type HomeService = ReturnType<typeof homeService>;
