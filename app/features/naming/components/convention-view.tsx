import { useState } from 'react';
import type { NamingConvention, NamingRule } from '../../../../shared/schemas/naming';
import { Button } from '../../../components/ui/button';
import { ConventionForm } from './convention-form';

function tokenText(t: NamingRule['tokens'][number]) {
  if (t.type === 'list') return `one of ${t.values.join(', ')}`;
  if (t.type === 'number') return `a number written like ${t.format}${t.min !== undefined ? `, from ${t.min}` : ''}${t.max !== undefined ? ` to ${t.max}` : ''}`;
  return t.hint ?? `text matching ${t.regex}`;
}

function RuleView({ title, rule }: { title: string; rule: NamingRule }) {
  return (
    <section className="flex flex-col gap-2 rounded border border-slate-300 bg-white p-4">
      <h2 className="text-lg font-semibold">{title}</h2>
      <p className="text-slate-700">A name fits one of these patterns; {rule.case === 'upper' ? 'capitals only' : rule.case === 'lower' ? 'lower case only' : 'any case'}, {rule.minLength}–{rule.maxLength} characters.</p>
      <ul className="flex flex-wrap gap-2">{rule.patterns.map((p) => <li key={p} className="rounded border border-slate-300 bg-slate-50 px-2 py-1 font-mono">{p}</li>)}</ul>
      <table className="w-fit text-[15px]">
        <tbody>{rule.tokens.map((t) => <tr key={t.name}><td className="pr-4 font-mono font-semibold">{`{${t.name}}`}</td><td>{tokenText(t)}</td></tr>)}</tbody>
      </table>
    </section>
  );
}

/** The rules in words for everyone; the lead edits them in a form, checked as typed and by the server on save. */
export function ConventionView({ convention, canEdit }: { convention: NamingConvention; canEdit: boolean }) {
  const [editing, setEditing] = useState(false);
  return (
    <div className="flex min-w-0 flex-col gap-4">
      <p className="text-slate-700">Version <span className="num">{convention.version}</span> is in force. Every component code, every layer of an imported or exported drawing, every manifest row and every release is checked against it.</p>
      <div className="grid grid-cols-1 gap-4 lg:grid-cols-2">
        <RuleView title="Layer names" rule={convention.layer} />
        <RuleView title="Component codes" rule={convention.component} />
      </div>
      {canEdit ? (
        editing ? <ConventionForm convention={convention} onCancel={() => setEditing(false)} />
          : <div><Button variant="secondary" onClick={() => setEditing(true)}>Edit the rules</Button></div>
      ) : null}
    </div>
  );
}
