import type { TableProblem } from '../bar-cells';

const SHOWN_PROBLEMS = 12;

/** The cells the check cannot read, each named by row and column, the first dozen listed. */
export function BarProblems({ problems }: { problems: readonly TableProblem[] }) {
  if (problems.length === 0) return null;
  return (
    <div role="alert" className="rounded border-l-4 border-danger-700 bg-danger-50 p-3 text-danger-700">
      <p className="font-semibold">{problems.length === 1 ? 'One cell needs fixing' : `${problems.length} cells need fixing`} before the check can run:</p>
      <ul className="mt-1 list-disc pl-5 text-slate-900">
        {problems.slice(0, SHOWN_PROBLEMS).map((p, i) => <li key={i}>{p.message}</li>)}
      </ul>
      {problems.length > SHOWN_PROBLEMS ? <p className="mt-1 text-slate-900">…and {problems.length - SHOWN_PROBLEMS} more.</p> : null}
    </div>
  );
}
