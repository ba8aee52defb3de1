import { useEffect, useRef } from 'react';
import type { z } from 'zod';
import { Ban, ListOrdered } from 'lucide-react';
import { STOCK_CHECK_ADVICE, UNPLACEABLE_TEXT } from '../../../../shared/clamps/reason-text';
import { shiftInWords } from '../../../../shared/clamps/shift-words';
import type { Unit } from '../../../../shared/schemas/common';
import { formatLength } from '../../../../shared/units/units';
import { Notice } from '../../../components/ui/notice';
import type { JobStockCheckAnswerSchema } from '../../jobs/api';

export type JobCheckAnswerData = z.output<typeof JobStockCheckAnswerSchema>;

const plural = (n: number, word = 'bar') => `${n} ${word}${n === 1 ? '' : 's'}`;

/**
 * What a job's stock check answered, rail by rail, in the order the operator works: the target
 * opening of each setting and its bars, then the bars no setting takes. The chart and the bar-by-bar
 * table stay on the job page.
 */
export function JobCheckAnswer({ answer, unit }: { answer: JobCheckAnswerData; unit: Unit }) {
  const heading = useRef<HTMLHeadingElement>(null);
  useEffect(() => { heading.current?.focus(); }, [answer]);
  const rails = answer.rails.length > 0 ? answer.rails : [{ jawPlacement: answer.jawPlacement, jawComponent: '', nominalOpening: answer.nominalOpening, appliesTo: answer.appliesTo, result: answer }];
  return (
    <div className="flex flex-col gap-4">
      <h2 ref={heading} tabIndex={-1} className="text-xl font-semibold outline-none focus-visible:ring-2 focus-visible:ring-accent-600">Which bars go on which setting</h2>
      {rails.map((rail) => (
        <section key={rail.jawPlacement} aria-label={`Rail ${rail.jawPlacement}`} className="flex flex-col gap-2 rounded border border-slate-300 bg-white p-3 sm:p-4">
          <h3 className="flex flex-wrap items-center gap-x-2 text-lg font-semibold">
            <ListOrdered aria-hidden className="h-5 w-5" />Rail <span className="font-mono">{rail.jawPlacement}</span>
            <span className="text-base font-normal text-slate-700">{rail.jawComponent ? `${rail.jawComponent}, ` : ''}nominal opening <span className="num">{formatLength(rail.nominalOpening, unit)}</span></span>
          </h3>
          {rail.result.settings.length > 0 ? (
            <ol aria-label={`Sorting list of ${rail.jawPlacement}`} className="flex flex-col divide-y divide-slate-200">
              {rail.result.settings.map((s, k) => (
                <li key={k} className="py-2">
                  <p data-testid="job-setting-line" className="text-lg">
                    <span className="font-semibold">Setting {k + 1}:</span> target opening <span className="num font-semibold">{formatLength(s.targetOpening ?? rail.nominalOpening + s.shift, unit)}</span>
                    {s.room === undefined ? '' : <> ± <span className="num">{formatLength(s.room, unit)}</span></>}
                    {' — '}{s.bars.length === 1 ? 'bar' : 'bars'} <span className="font-mono break-all">{s.bars.join(', ')}</span>
                  </p>
                  <p className="text-slate-800">To set it: {shiftInWords(s.shift, unit)}.</p>
                </li>
              ))}
            </ol>
          ) : <p className="text-slate-800">No bar can go on this rail.</p>}
          {rail.result.unplaceable.length > 0 ? (
            <p className="flex items-start gap-2 text-slate-900">
              <Ban aria-hidden className="mt-1 h-5 w-5 shrink-0" />
              <span>Cannot be used on this rail ({plural(rail.result.unplaceable.length)}, {UNPLACEABLE_TEXT}): <span className="font-mono font-semibold break-all">{rail.result.unplaceable.join(', ')}</span></span>
            </p>
          ) : null}
          {rail.result.warnings.map((w) => <Notice key={w.code} tone="danger" title="Fixed jaw in the tool's path"><p>{w.message}</p></Notice>)}
        </section>
      ))}
      {answer.railsNotChecked.length > 0 ? (
        <p className="text-slate-800">Not checked: <span className="font-mono font-semibold">{answer.railsNotChecked.join(', ')}</span>; check the bars for {answer.railsNotChecked.length === 1 ? 'it' : 'them'} before loading.</p>
      ) : null}
      <Notice tone="caution" title="Advice, not a go-ahead"><p>{STOCK_CHECK_ADVICE}</p></Notice>
    </div>
  );
}
