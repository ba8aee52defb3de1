import { Archive, BadgeCheck, CornerUpLeft, Hourglass, PencilLine, type LucideIcon } from 'lucide-react';
import type { VersionStatus } from '../../../shared/schemas/template-api';
import { STATUS_WORDS } from '../../../shared/review/lifecycle';

const LOOK: Record<VersionStatus, { box: string; Icon: LucideIcon }> = {
  draft: { box: 'border border-slate-400 bg-white text-slate-800', Icon: PencilLine },
  // Sent back: a heavier dashed frame and its own icon and words, so it never reads as a plain draft
  // (the shape and the words carry it; no safety hue is spent on it).
  'changes-requested': { box: 'border-2 border-dashed border-slate-800 bg-slate-100 text-slate-900', Icon: CornerUpLeft },
  'in-review': { box: 'border border-accent-700 bg-accent-50 text-accent-800', Icon: Hourglass },
  released: { box: 'border border-slate-800 bg-slate-800 text-white', Icon: BadgeCheck },
  retired: { box: 'border border-slate-300 bg-white text-slate-500 line-through', Icon: Archive },
};

/** A version's status as a word with an icon; color only reinforces it. */
export function VersionStatusTag({ status, className = '' }: { status: VersionStatus; className?: string }) {
  const { box, Icon } = LOOK[status];
  return (
    <span data-status={status} className={`inline-flex items-center gap-1 whitespace-nowrap rounded px-2 py-0.5 text-sm font-semibold ${box} ${className}`}>
      <Icon aria-hidden className="h-4 w-4 shrink-0" />
      {STATUS_WORDS[status]}
    </span>
  );
}
