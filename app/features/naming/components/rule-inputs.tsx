import { createContext, use, type ReactNode } from 'react';
import { Minus } from 'lucide-react';
import { inputClass } from '../../../components/ui/field';
import { fieldId } from '../issue-fields';

/** The problems of the rules being edited, by the path of the field that shows them (issue-fields.ts). */
export const IssuesContext = createContext<Map<string, string[]>>(new Map());

const useErrors = (path: string) => use(IssuesContext).get(path) ?? [];

/** A field's problems, each a sentence, under it; the field points at them with aria-describedby. */
export function FieldErrors({ path, messages }: { path: string; messages: string[] }) {
  if (!messages.length) return null;
  return (
    <ul id={`${fieldId(path)}-error`} className="flex flex-col gap-1 text-sm text-danger-700">
      {messages.map((m) => <li key={m}>{m}</li>)}
    </ul>
  );
}

const described = (path: string, messages: string[], hint?: ReactNode) =>
  [messages.length ? `${fieldId(path)}-error` : '', hint ? `${fieldId(path)}-hint` : ''].filter(Boolean).join(' ') || undefined;

interface InputProps {
  path: string;
  label: string;
  value: string;
  onChange: (value: string) => void;
  hint?: ReactNode;
  mono?: boolean;
  inputMode?: 'decimal' | 'numeric' | 'text';
  placeholder?: string;
}

/** A labelled text field whose id is its path's (so a problem links to it). */
export function RuleInput({ path, label, value, onChange, hint, mono, inputMode, placeholder }: InputProps) {
  const messages = useErrors(path);
  const id = fieldId(path);
  return (
    <div className="flex min-w-0 flex-col gap-1">
      <label htmlFor={id} className="text-sm font-semibold text-slate-700">{label}</label>
      <input
        id={id} value={value} onChange={(e) => onChange(e.target.value)} inputMode={inputMode} placeholder={placeholder} spellCheck={false}
        aria-invalid={messages.length > 0} aria-describedby={described(path, messages, hint)}
        className={`${inputClass} ${mono ? 'font-mono' : ''} ${inputMode === 'decimal' || inputMode === 'numeric' ? 'num' : ''}`}
      />
      {hint && !messages.length ? <p id={`${id}-hint`} className="text-sm text-slate-600">{hint}</p> : null}
      <FieldErrors path={path} messages={messages} />
    </div>
  );
}

export function RuleSelect({ path, label, value, onChange, options }: { path: string; label: string; value: string; onChange: (value: string) => void; options: readonly { value: string; label: string }[] }) {
  const messages = useErrors(path);
  const id = fieldId(path);
  return (
    <div className="flex min-w-0 flex-col gap-1">
      <label htmlFor={id} className="text-sm font-semibold text-slate-700">{label}</label>
      <select id={id} value={value} onChange={(e) => onChange(e.target.value)} aria-invalid={messages.length > 0} aria-describedby={described(path, messages)} className={inputClass}>
        {options.map((o) => <option key={o.value} value={o.value}>{o.label}</option>)}
      </select>
      <FieldErrors path={path} messages={messages} />
    </div>
  );
}

/** One row of a list (a pattern, a list value): the field, named for screen readers, and a button that removes the row. */
export function RowInput({ path, label, value, onChange, onRemove, mono = true }: { path: string; label: string; value: string; onChange: (v: string) => void; onRemove: () => void; mono?: boolean }) {
  const messages = useErrors(path);
  const id = fieldId(path);
  return (
    <li className="flex flex-col gap-1">
      <div className="flex items-center gap-2">
        <input
          id={id} aria-label={label} value={value} onChange={(e) => onChange(e.target.value)} spellCheck={false}
          aria-invalid={messages.length > 0} aria-describedby={described(path, messages)}
          className={`${inputClass} min-w-0 flex-1 ${mono ? 'font-mono' : ''}`}
        />
        <button type="button" onClick={onRemove} aria-label={`Remove ${label.toLowerCase()}`} title={`Remove ${label.toLowerCase()}`} className="inline-flex min-h-11 min-w-11 items-center justify-center rounded border border-slate-400 bg-white text-slate-700 hover:bg-slate-100">
          <Minus aria-hidden className="h-4 w-4" />
        </button>
      </div>
      <FieldErrors path={path} messages={messages} />
    </li>
  );
}

/** A list of rows with its own problems (no rows, too many) said above it. */
export function RowList({ path, legend, children, add }: { path: string; legend: string; children: ReactNode; add: ReactNode }) {
  const messages = useErrors(path);
  return (
    <fieldset id={fieldId(path)} tabIndex={-1} className="flex min-w-0 flex-col gap-2" aria-describedby={messages.length ? `${fieldId(path)}-error` : undefined}>
      <legend className="text-sm font-semibold text-slate-700">{legend}</legend>
      <FieldErrors path={path} messages={messages} />
      <ul className="flex flex-col gap-2">{children}</ul>
      <div>{add}</div>
    </fieldset>
  );
}
