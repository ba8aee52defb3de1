import { ChevronsLeftRight, ChevronsRightLeft, CircleCheck, Layers2, OctagonAlert, TriangleAlert } from 'lucide-react';
import { VERDICT_TONE, VERDICT_WORD, verdictSentence, type Verdict, type VerdictTone } from '../verdicts';

const ICON: Readonly<Record<Verdict, typeof CircleCheck>> = {
  accepted: CircleCheck,
  'too-narrow': ChevronsRightLeft,
  'too-wide': ChevronsLeftRight,
  'thinner-than-carrier': Layers2,
  'clamp-above-carrier': OctagonAlert,
  'short-bite': TriangleAlert,
};

// Text on a light tint of its hue; yellow text is unreadable on white, so caution reads in its dark shade.
const BADGE: Readonly<Record<VerdictTone, string>> = {
  safe: 'border-safe-700 bg-safe-50 text-safe-700',
  caution: 'border-caution-400 bg-caution-50 text-caution-800',
  warning: 'border-warning-700 bg-warning-50 text-warning-700',
  danger: 'border-danger-700 bg-danger-50 text-danger-700',
};

/** A verdict said in words with its icon; the hue only reinforces it. `detail` adds reason-text.ts's sentence. */
export function VerdictBadge({ verdict, detail = false }: { verdict: Verdict; detail?: boolean }) {
  const Icon = ICON[verdict];
  return (
    <span className="inline-flex flex-col items-start gap-0.5">
      <span className={`inline-flex items-center gap-1.5 rounded border px-2 py-0.5 font-semibold ${BADGE[VERDICT_TONE[verdict]]}`} title={verdictSentence(verdict)}>
        <Icon aria-hidden className="h-4 w-4 shrink-0" />
        {VERDICT_WORD[verdict]}
      </span>
      {detail && verdict !== 'accepted' ? <span className="text-sm text-slate-700">{verdictSentence(verdict)}</span> : null}
    </span>
  );
}

/** Fill and outline classes for a chart mark: the safety palette, each with a dark outline for contrast. */
const SHAPE_CLASS: Readonly<Record<VerdictTone, string>> = {
  safe: 'fill-safe-700 stroke-white',
  caution: 'fill-caution-400 stroke-caution-800',
  warning: 'fill-warning-700 stroke-white',
  danger: 'fill-danger-700 stroke-white',
};

/**
 * One mark per verdict, each its own shape so the chart reads without color: a circle for accepted,
 * a diamond for a bar that will not fit, a triangle for the pull-out risk and an octagon for the
 * collision risk (the shapes of the icons beside the words).
 */
export function VerdictShape({ verdict, x, y, r = 8 }: { verdict: Verdict; x: number; y: number; r?: number }) {
  const cls = `${SHAPE_CLASS[VERDICT_TONE[verdict]]} stroke-[1.5]`;
  switch (verdict) {
    case 'accepted':
      return <circle cx={x} cy={y} r={r} className={cls} />;
    case 'too-narrow':
    case 'too-wide':
      return <path d={`M${x} ${y - r * 1.2}L${x + r * 1.2} ${y}L${x} ${y + r * 1.2}L${x - r * 1.2} ${y}Z`} className={cls} />;
    case 'short-bite':
      return <path d={`M${x} ${y - r * 1.2}L${x + r * 1.15} ${y + r * 0.9}L${x - r * 1.15} ${y + r * 0.9}Z`} className={cls} />;
    case 'clamp-above-carrier': {
      const pts = Array.from({ length: 8 }, (_, k) => {
        const a = Math.PI / 8 + (k * Math.PI) / 4;
        return `${(x + r * 1.08 * Math.cos(a)).toFixed(2)},${(y + r * 1.08 * Math.sin(a)).toFixed(2)}`;
      });
      return <polygon points={pts.join(' ')} className={cls} />;
    }
  }
}

/** A small stand-alone mark for legends and lists. */
export function VerdictSwatch({ verdict }: { verdict: Verdict }) {
  return (
    <svg aria-hidden width="22" height="22" viewBox="0 0 22 22" className="shrink-0">
      <VerdictShape verdict={verdict} x={11} y={11} r={7} />
    </svg>
  );
}
