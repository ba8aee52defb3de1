import { useState, type ReactNode } from 'react';
import { ChevronDown } from 'lucide-react';

/** The phone/desk boundary of the app (Tailwind's md, where tables turn into cards below it). */
const DESK = '(min-width: 768px)';
const atDesk = () => typeof window === 'undefined' || typeof window.matchMedia !== 'function' || window.matchMedia(DESK).matches;

export interface JumpTarget { id: string; label: string }

/**
 * "On this page": one link per section of the job page, near its top, so the operator on a phone
 * reaches the load list (or any section) in one tap. A link to a folded section unfolds it.
 */
export function JumpList({ targets }: { targets: readonly JumpTarget[] }) {
  const open = (id: string) => {
    const el = document.getElementById(id);
    for (let d = el?.closest('details') ?? null; d; d = d.parentElement?.closest('details') ?? null) d.open = true;
  };
  return (
    <nav aria-label="On this page" className="print:hidden">
      <ul className="flex flex-wrap gap-2">
        {targets.map((t) => (
          <li key={t.id}>
            <a href={`#${t.id}`} onClick={() => open(t.id)}
              className="inline-flex min-h-11 items-center rounded border border-slate-400 bg-white px-3 font-semibold text-accent-800 hover:bg-slate-100">
              {t.label}
            </a>
          </li>
        ))}
      </ul>
    </nav>
  );
}

/**
 * A section that folds: open at desk width, and on a phone open unless `foldOnPhone` (a long table
 * the operator rarely needs at the machine). Its heading is the summary, so it is always in view.
 */
export function FoldingSection({ id, title, foldOnPhone = false, children }: { id: string; title: ReactNode; foldOnPhone?: boolean; children: ReactNode }) {
  const [initiallyOpen] = useState(() => !foldOnPhone || atDesk());
  return (
    <details id={id} open={initiallyOpen} className="group scroll-mt-4 border-t border-slate-300 pt-3">
      <summary className="flex min-h-11 cursor-pointer list-none items-center gap-2 text-xl font-semibold [&::-webkit-details-marker]:hidden">
        <ChevronDown aria-hidden className="h-5 w-5 shrink-0 transition-transform group-[:not([open])]:-rotate-90" />
        {title}
      </summary>
      <div className="mt-3 flex flex-col gap-4">{children}</div>
    </details>
  );
}
