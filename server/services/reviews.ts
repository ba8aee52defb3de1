import type { User } from '../../shared/schemas/auth';
import type { TemplateVersion } from '../../shared/schemas/template-api';
import type { VersionDiffAnswer } from '../../shared/schemas/diff';
import { stationValueChanges } from '../../shared/compare/station-values';
import type { ReviewAction } from '../../shared/review/lifecycle';
import { compareVersions } from '../../shared/compare/compare-versions';
import { versionNamingProblems } from '../../shared/naming/version-names';
import type { Db } from '../db/knex';
import { reviewsRepo } from '../db/reviews-repo';
import type { UsersRepo } from '../db/users-repo';
import { HttpError } from '../middleware/errors';
import type { Mailer, OutgoingMail } from '../mail/mailer';
import type { NamingService } from './naming';
import type { TemplatesService } from './templates';


interface Deps {
  db: Db;
  templates: TemplatesService;
  users: UsersRepo;
  naming: NamingService;
  mailer?: Mailer;
  publicUrl: string;
}

export function reviewsService(deps: Deps) {
  const { db, templates, users, naming, mailer, publicUrl } = deps;
  const trail = reviewsRepo(db);

  async function step(user: User, templateId: number, number: number, action: ReviewAction, comment = '') {
    const convention = await naming.current();
    const { before: v } = await templates.changeVersion(user, templateId, number, action, {
      check: (v) => {
        const presented = templates.present(templateId, v);
        if ((action === 'submit' || action === 'approve') && presented.problems.length) {
          throw new HttpError(400, 'layout-problems', `Version ${number} cannot go on: ${presented.problems[0]!.message}${presented.problems.length > 1 ? ` (and ${presented.problems.length - 1} more)` : ''}`, { problems: presented.problems });
        }
        if (action !== 'approve') return;
        const names = versionNamingProblems(v.content, convention);
        if (names.length && !v.row.naming_waiver) {
          throw new HttpError(400, 'naming', `Version ${number} breaks the naming convention: ${names[0]!.message}. Fix the names, or a lead waives them in writing before approval.`, { naming: names });
        }
      },
      also: (trx, v) => trail.add(trx, { versionId: v.row.id, action, comment, userId: user.id }),
      audit: (v, to) => ({ action: `version.${action}`, summary: `${v.content.name} v${number}: ${v.row.state} → ${to}${comment ? ` — "${comment}"` : ''}`, before: { state: v.row.state }, after: { state: to, comment: comment || undefined } }),
    });
    await notify(action, templates.present(templateId, v), user, comment, v.row.author_id);
    return templates.present(templateId, await templates.requireVersion(templateId, number));
  }

  /** Review notices: reviewers hear of a submission, the author of the verdict. A mail failure never undoes the step. */
  async function notify(action: ReviewAction, v: TemplateVersion, actor: User, comment: string, authorId: number | null) {
    if (!mailer) return;
    const link = `${publicUrl}/templates/${v.templateId}/compare?to=${v.version}`;
    const mails: OutgoingMail[] = [];
    if (action === 'submit') {
      for (const r of (await users.list()).filter((u) => u.role === 'reviewer' && u.active && u.id !== actor.id)) {
        mails.push({ to: r.email, subject: `Review requested: ${v.name} v${v.version}`, text: `${actor.name} submitted ${v.name} version ${v.version} (${v.stations.length} stations) for review.\n\nCompare it with the version before: ${link}\n\nContent hash ${v.contentHash}` });
      }
    } else if (action === 'approve' || action === 'request-changes') {
      const author = authorId ? await users.findById(authorId) : undefined;
      if (author) {
        const verdict = action === 'approve' ? 'approved and released' : 'sent back with changes requested';
        mails.push({ to: author.email, subject: `${v.name} v${v.version} ${verdict}`, text: `${actor.name} ${verdict} ${v.name} version ${v.version}.${comment ? `\n\nComment: ${comment}` : ''}\n\n${link}` });
      }
    }
    for (const m of mails) {
      try {
        await mailer.send(m);
      } catch (err) {
        console.error('review notice not sent', err);
      }
    }
  }

  return {
    submit: (u: User, id: number, n: number) => step(u, id, n, 'submit'),
    approve: (u: User, id: number, n: number, comment: string) => step(u, id, n, 'approve', comment),
    requestChanges: (u: User, id: number, n: number, comment: string) => step(u, id, n, 'request-changes', comment),
    retire: (u: User, id: number, n: number) => step(u, id, n, 'retire'),
    async reviews(templateId: number, number: number) {
      const v = await templates.requireVersion(templateId, number);
      return trail.trail(v.row.id);
    },
    async diff(templateId: number, from: number, to: number): Promise<VersionDiffAnswer> {
      const [a, b] = await Promise.all([templates.requireVersion(templateId, from), templates.requireVersion(templateId, to)]);
      const convention = await naming.current();
      const diff = compareVersions(a.content, b.content, {
        namingProblems: (content) => versionNamingProblems(content, convention).map((p) => ({ key: p.key, message: p.message })),
      });
      return { ...diff, stationValues: stationValueChanges(diff.stations) };
    },
  };
}
export type ReviewsService = ReturnType<typeof reviewsService>;
