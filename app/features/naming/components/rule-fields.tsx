import type { Dispatch } from 'react';
import { Plus, Trash2 } from 'lucide-react';
import type { NamingTarget } from '../../../../shared/schemas/naming';
import { Button } from '../../../components/ui/button';
import { fieldId } from '../issue-fields';
import type { RuleDraft, RulesAction, TokenDraft, TokenField } from '../rule-draft';
import { RowInput, RowList, RuleInput, RuleSelect } from './rule-inputs';

const CASE_OPTIONS = [
  { value: 'upper', label: 'Capitals only' },
  { value: 'lower', label: 'Lower case only' },
  { value: 'any', label: 'Any case' },
] as const;

const TYPE_OPTIONS = [
  { value: 'list', label: 'One of a list' },
  { value: 'number', label: 'A number' },
  { value: 'regex', label: 'Text of a pattern (regular expression)' },
] as const;

const TITLES: Record<NamingTarget, string> = { layer: 'Layer names', component: 'Component codes' };

/** One rule: its patterns, its case and length limits, and a table of its tokens. */
export function RuleFields({ target, rule, dispatch }: { target: NamingTarget; rule: RuleDraft; dispatch: Dispatch<RulesAction> }) {
  const p = (rest: string) => `${target}.${rest}`;
  return (
    <section aria-labelledby={`${target}-rule-title`} className="flex min-w-0 flex-col gap-4 rounded border border-slate-300 bg-white p-4">
      <h3 id={`${target}-rule-title`} className="text-lg font-semibold">{TITLES[target]}</h3>
      <RowList
        path={p('patterns')} legend="Patterns (a name fits any one; {token} stands for a token below)"
        add={<Button variant="secondary" onClick={() => dispatch({ type: 'add-pattern', target })}><Plus aria-hidden className="h-4 w-4" />Add a pattern</Button>}
      >
        {rule.patterns.map((pattern, i) => (
          <RowInput
            key={pattern.key} path={p(`patterns.${i}`)} label={`Pattern ${i + 1}`} value={pattern.text}
            onChange={(value) => dispatch({ type: 'pattern', target, index: i, value })} onRemove={() => dispatch({ type: 'remove-pattern', target, index: i })}
          />
        ))}
      </RowList>
      <div className="grid grid-cols-1 gap-3 sm:grid-cols-3">
        <RuleSelect path={p('case')} label="Case" value={rule.case} options={CASE_OPTIONS} onChange={(value) => dispatch({ type: 'rule', target, field: 'case', value })} />
        <RuleInput path={p('minLength')} label="Shortest length (characters)" inputMode="numeric" value={rule.minLength} onChange={(value) => dispatch({ type: 'rule', target, field: 'minLength', value })} />
        <RuleInput path={p('maxLength')} label="Longest length (characters)" inputMode="numeric" value={rule.maxLength} onChange={(value) => dispatch({ type: 'rule', target, field: 'maxLength', value })} />
      </div>
      <RowList
        path={p('tokens')} legend="Tokens"
        add={<Button variant="secondary" onClick={() => dispatch({ type: 'add-token', target })}><Plus aria-hidden className="h-4 w-4" />Add a token</Button>}
      >
        {rule.tokens.map((token, i) => <TokenFields key={token.key} target={target} index={i} token={token} dispatch={dispatch} />)}
      </RowList>
    </section>
  );
}

function TokenFields({ target, index, token, dispatch }: { target: NamingTarget; index: number; token: TokenDraft; dispatch: Dispatch<RulesAction> }) {
  const p = (rest: string) => `${target}.tokens.${index}.${rest}`;
  const set = (field: TokenField) => (value: string) => dispatch({ type: 'token', target, index, field, value });
  const title = token.name.trim() ? `Token {${token.name.trim()}}` : `Token ${index + 1}`;
  return (
    <li className="flex min-w-0 flex-col gap-3 rounded border border-slate-300 bg-slate-50 p-3" aria-label={title}>
      <div className="flex flex-wrap items-center justify-between gap-2">
        <h4 className="font-mono font-semibold">{title}</h4>
        <Button variant="danger" onClick={() => dispatch({ type: 'remove-token', target, index })} aria-label={`Remove ${title.toLowerCase()}`}><Trash2 aria-hidden className="h-4 w-4" />Remove</Button>
      </div>
      <div className="grid grid-cols-1 gap-3 sm:grid-cols-2">
        <RuleInput path={p('name')} label="Name" mono value={token.name} onChange={set('name')} placeholder="kind" />
        <RuleSelect path={p('type')} label="Values are" value={token.type} options={TYPE_OPTIONS} onChange={set('type')} />
      </div>
      {token.type === 'list' ? (
        <RowList
          path={p('values')} legend={`Allowed values of ${title.toLowerCase()}`}
          add={<Button variant="secondary" onClick={() => dispatch({ type: 'add-value', target, token: index })}><Plus aria-hidden className="h-4 w-4" />Add a value</Button>}
        >
          {token.values.map((v, k) => (
            <RowInput
              key={v.key} path={p(`values.${k}`)} label={`Value ${k + 1} of ${title.toLowerCase()}`} value={v.text}
              onChange={(value) => dispatch({ type: 'value', target, token: index, index: k, value })}
              onRemove={() => dispatch({ type: 'remove-value', target, token: index, index: k })}
            />
          ))}
        </RowList>
      ) : null}
      {token.type === 'number' ? (
        <div className="grid grid-cols-1 gap-3 sm:grid-cols-3">
          <RuleInput path={p('format')} label="Number format" mono value={token.format} onChange={set('format')} hint="0 a digit that must be there, # a decimal that may be left off: 0, 000, 0.000, 0.0##" />
          <RuleInput path={p('min')} label="Smallest value" inputMode="decimal" value={token.min} onChange={set('min')} hint="Blank: no lower limit" />
          <RuleInput path={p('max')} label="Largest value" inputMode="decimal" value={token.max} onChange={set('max')} hint="Blank: no upper limit" />
        </div>
      ) : null}
      {token.type === 'regex' ? (
        <div className="grid grid-cols-1 gap-3 sm:grid-cols-2">
          <RuleInput path={p('regex')} label="Regular expression" mono value={token.regex} onChange={set('regex')} hint="The whole value must match; letters match in any case" />
          <RuleInput path={p('hint')} label="What the values look like" value={token.hint} onChange={set('hint')} placeholder="a part number such as 10452-A" />
        </div>
      ) : null}
    </li>
  );
}

/** Moves the keyboard to the field of the first problem, so the lead lands where to fix it. */
export function focusField(path: string) {
  const el = document.getElementById(fieldId(path));
  el?.focus();
  el?.scrollIntoView({ block: 'center' });
}
