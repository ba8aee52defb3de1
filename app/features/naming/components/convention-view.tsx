import { useState } from 'react';
import type { NamingConvention, NamingRule } from '../../../../shared/schemas/naming';
import { Button } from '../../../components/ui/button';
import { Notice } from '../../../components/ui/notice';
import { ApiError } from '../../../lib/api-client';
import { useSaveConvention } from '../api';

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

/** The rules in words for everyone; the lead edits them as JSON, checked by the server on save. */
export function ConventionView({ convention, canEdit }: { convention: NamingConvention; canEdit: boolean }) {
  const [editing, setEditing] = useState(false);
  const { version: _v, ...rules } = convention;
  const [text, setText] = useState(() => JSON.stringify(rules, null, 2));
  const [parseError, setParseError] = useState<string | null>(null);
  const save = useSaveConvention();
  const submit = () => {
    setParseError(null);
    let body: unknown;
    try {
      body = JSON.parse(text);
    } catch (e) {
      setParseError(`The rules are not valid JSON: ${(e as Error).message}`);
      return;
    }
    save.mutate(body as Omit<NamingConvention, 'version'>, { onSuccess: () => setEditing(false) });
  };
  const issues = save.error instanceof ApiError ? save.error.issues : [];
  return (
    <div className="flex flex-col gap-4">
      <p className="text-slate-700">Version <span className="num">{convention.version}</span> is in force. Every component code, every layer of an imported or exported drawing, every manifest row and every release is checked against it.</p>
      <div className="grid grid-cols-1 gap-4 lg:grid-cols-2">
        <RuleView title="Layer names" rule={convention.layer} />
        <RuleView title="Component codes" rule={convention.component} />
      </div>
      {canEdit ? (
        editing ? (
          <section className="flex flex-col gap-2">
            <label htmlFor="rules-json" className="font-semibold">Rules (JSON; saving makes version {convention.version + 1})</label>
            <textarea id="rules-json" className="min-h-96 rounded border border-slate-400 p-3 font-mono text-[15px]" value={text} onChange={(e) => setText(e.target.value)} spellCheck={false} />
            {parseError ? <Notice tone="danger" title={parseError} /> : null}
            {save.error ? (
              <Notice tone="danger" title={save.error.message}>
                {issues.length ? <ul className="list-disc pl-5">{issues.map((i) => <li key={i.path + i.message}><span className="font-mono">{i.path}</span>: {i.message}</li>)}</ul> : null}
              </Notice>
            ) : null}
            <div className="flex gap-2"><Button onClick={submit} disabled={save.isPending}>Save as version {convention.version + 1}</Button><Button variant="secondary" onClick={() => setEditing(false)}>Cancel</Button></div>
          </section>
        ) : <div><Button variant="secondary" onClick={() => setEditing(true)}>Edit the rules</Button></div>
      ) : null}
    </div>
  );
}
