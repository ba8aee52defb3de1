import { CAN, type Role } from '../schemas/auth';
import type { VersionState, VersionStatus } from '../schemas/template-api';

export const REVIEW_ACTIONS = ['edit', 'submit', 'approve', 'request-changes', 'retire', 'release'] as const;
export type ReviewAction = (typeof REVIEW_ACTIONS)[number];
/** Starting a new draft from a version leaves that version as it is, whatever its state. */
export type LifecycleAction = ReviewAction | 'new-version';

export type Transition = { ok: true; to: VersionState } | { ok: false; status: 403 | 409; message: string };

interface Rule {
  roles: readonly Role[];
  from: readonly VersionState[];
  to: (from: VersionState) => VersionState;
  /** The one who wrote a version may not sign it off. */
  notByAuthor?: boolean;
  words: string;
}

/**
 * The review lifecycle: draft → in-review → released → retired, with changes requested sending a
 * version back to draft. A lead may also release directly (the lead decides which versions may be
 * released). Released and retired versions never change.
 */
const RULES: Record<LifecycleAction, Rule> = {
  edit: { roles: CAN.editTemplates, from: ['draft'], to: (s) => s, words: 'edit' },
  submit: { roles: CAN.editTemplates, from: ['draft'], to: () => 'in-review', words: 'submit for review' },
  approve: { roles: CAN.signOff, from: ['in-review'], to: () => 'released', notByAuthor: true, words: 'approve' },
  'request-changes': { roles: CAN.signOff, from: ['in-review'], to: () => 'draft', notByAuthor: true, words: 'send back with changes requested' },
  retire: { roles: CAN.releaseTemplates, from: ['released'], to: () => 'retired', words: 'retire' },
  release: { roles: CAN.releaseTemplates, from: ['draft', 'in-review'], to: () => 'released', words: 'release' },
  'new-version': { roles: CAN.editTemplates, from: ['draft', 'in-review', 'released', 'retired'], to: (s) => s, words: 'start a new draft from' },
};

export function transition(state: VersionState, action: LifecycleAction, actor: { role: Role; isAuthor: boolean }): Transition {
  const rule = RULES[action];
  if (!rule.roles.includes(actor.role)) return { ok: false, status: 403, message: `Your role (${actor.role}) may not ${rule.words} a version; it takes ${rule.roles.join(' or ')}.` };
  if (!rule.from.includes(state)) {
    const why = state === 'released' || state === 'retired' ? `${state} versions never change` : `only a version that is ${rule.from.join(' or ')} can be`;
    return { ok: false, status: 409, message: `This version is ${state}: ${why}${why.startsWith('only') ? ` ${action === 'edit' ? 'edited' : 'taken through this step'}` : ''}.` };
  }
  if (rule.notByAuthor && actor.isAuthor) return { ok: false, status: 403, message: `You wrote this version, so someone else must ${rule.words} it.` };
  return { ok: true, to: rule.to(state) };
}

/**
 * What a version shows besides its state: a draft whose latest review step is a reviewer's
 * request for changes reads "changes requested" (with the comment) until its author submits it
 * again, so a version sent back never looks like a draft nobody has read. Saving the draft in
 * between keeps the mark; only the next review step (submit) clears it.
 */
export function versionStatus(state: VersionState, lastReviewStep: string | null | undefined): VersionStatus {
  return state === 'draft' && lastReviewStep === 'request-changes' ? 'changes-requested' : state;
}

/** Words and the accessible name of each status, one place for every screen that shows a version. */
export const STATUS_WORDS: Record<VersionStatus, string> = {
  draft: 'draft',
  'changes-requested': 'changes requested',
  'in-review': 'in review',
  released: 'released',
  retired: 'retired',
};

/**
 * The version a reviewer reads version `n` against: the latest released (or retired) version before
 * it, else the version just before it; null for a first version.
 */
export function compareBase(versions: readonly { number: number; state: VersionState }[], n: number): number | null {
  const before = versions.filter((v) => v.number < n).sort((a, b) => a.number - b.number);
  return before.filter((v) => v.state === 'released' || v.state === 'retired').at(-1)?.number ?? before.at(-1)?.number ?? null;
}
