import { useMemo, useReducer } from 'react';
import type { FieldIssue } from '../../../../shared/schemas/issues';
import { NAMING_TARGETS, type NamingConvention } from '../../../../shared/schemas/naming';
import { Button } from '../../../components/ui/button';
import { Notice } from '../../../components/ui/notice';
import { ApiError } from '../../../lib/api-client';
import { useSaveConvention } from '../api';
import { fieldId, fieldWords, issuesByField } from '../issue-fields';
import { checkRules, editRules, rulesDraft, rulesInput, type RulesAction, type RulesDraft } from '../rule-draft';
import { JsonExchange } from './json-exchange';
import { focusField, RuleFields } from './rule-fields';
import { IssuesContext } from './rule-inputs';

interface FormState {
  rules: RulesDraft;
  /** After the first save attempt the rules are checked as they are typed, so a fixed field clears at once. */
  tried: boolean;
  /** What the server refused, shown until the next change. */
  serverIssues: FieldIssue[];
}

type FormAction = RulesAction | { type: 'tried' } | { type: 'server-issues'; issues: FieldIssue[] };

function reducer(s: FormState, a: FormAction): FormState {
  if (a.type === 'tried') return { ...s, tried: true };
  if (a.type === 'server-issues') return { ...s, serverIssues: a.issues };
  return { ...s, rules: editRules(s.rules, a), serverIssues: [] };
}

/**
 * The lead's editor of the naming rules: each rule's patterns and tokens as fields with rows to add
 * and remove, every problem said on its own field (checked here with the schema the server uses,
 * and the server's answer placed the same way), the JSON kept for import and export. Saving sends the
 * version the edit started from; a version saved by someone else meanwhile is refused (409).
 */
export function ConventionForm({ convention, onCancel }: { convention: NamingConvention; onCancel: () => void }) {
  const [state, dispatch] = useReducer(reducer, convention, (c): FormState => ({ rules: rulesDraft(c), tried: false, serverIssues: [] }));
  const save = useSaveConvention();
  const local = useMemo(() => (state.tried ? checkRules(state.rules) : []), [state.tried, state.rules]);
  const issues = local.length ? local : state.serverIssues;
  const byField = useMemo(() => issuesByField(issues), [issues]);

  const submit = () => {
    dispatch({ type: 'tried' });
    const found = checkRules(state.rules);
    if (found.length) {
      focusField([...issuesByField(found).keys()][0]!);
      return;
    }
    save.mutate({ ...rulesInput(state.rules), revision: convention.version }, {
      onError: (e) => {
        if (!(e instanceof ApiError) || !e.issues.length) return;
        dispatch({ type: 'server-issues', issues: e.issues });
        focusField([...issuesByField(e.issues).keys()][0]!);
      },
    });
  };
  const stale = save.error instanceof ApiError && save.error.status === 409;

  return (
    <IssuesContext value={byField}>
      <form id="naming-form" tabIndex={-1} className="flex min-w-0 flex-col gap-4" noValidate onSubmit={(e) => { e.preventDefault(); submit(); }} aria-labelledby="rules-form-title">
        <h2 id="rules-form-title" className="text-xl font-semibold">Edit the rules (saving makes version <span className="num">{convention.version + 1}</span>)</h2>
        {byField.size ? <ProblemList byField={byField} rules={state.rules} /> : null}
        {save.error && !(save.error instanceof ApiError && save.error.issues.length) ? (
          <Notice tone="danger" title={save.error.message}>{stale ? 'Your changes are still below: export them as JSON, reload the page, and load them again to save over the newer version.' : null}</Notice>
        ) : null}
        <div className="grid min-w-0 grid-cols-1 gap-4 xl:grid-cols-2">
          {NAMING_TARGETS.map((target) => <RuleFields key={target} target={target} rule={state.rules[target]} dispatch={dispatch} />)}
        </div>
        <JsonExchange rules={state.rules} onLoad={(rules) => dispatch({ type: 'load', rules })} />
        <div className="flex flex-wrap gap-2">
          <Button type="submit" disabled={save.isPending}>Save as version {convention.version + 1}</Button>
          <Button variant="secondary" onClick={onCancel}>Cancel</Button>
        </div>
      </form>
    </IssuesContext>
  );
}

/** Every problem in one list above the form, each a link to its field. */
function ProblemList({ byField, rules }: { byField: Map<string, string[]>; rules: RulesDraft }) {
  const count = [...byField.values()].reduce((n, m) => n + m.length, 0);
  return (
    <Notice tone="danger" title={count === 1 ? 'One thing to fix before the rules can be saved' : `${count} things to fix before the rules can be saved`}>
      <ul className="list-disc pl-5">
        {[...byField].flatMap(([path, messages]) => messages.map((m) => (
          <li key={path + m}>
            <a className="font-semibold underline" href={`#${fieldId(path)}`} onClick={(e) => { e.preventDefault(); focusField(path); }}>{fieldWords(path, rules)}</a>: {m}
          </li>
        )))}
      </ul>
    </Notice>
  );
}
