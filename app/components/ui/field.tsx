import { forwardRef, useId, type InputHTMLAttributes, type ReactNode, type SelectHTMLAttributes, type TextareaHTMLAttributes } from 'react';

const inputClass = 'min-h-10 w-full rounded border border-slate-400 bg-white px-3 py-2 text-base text-slate-900 aria-[invalid=true]:border-danger-700';

interface FieldShellProps {
  label: string;
  error?: string;
  hint?: ReactNode;
  unit?: string;
  children: (id: string, describedBy: string | undefined) => ReactNode;
}

export function FieldShell({ label, error, hint, unit, children }: FieldShellProps) {
  const id = useId();
  const describedBy = error ? `${id}-error` : hint ? `${id}-hint` : undefined;
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={id} className="text-sm font-semibold text-slate-700">
        {label}
        {unit ? <span className="ml-1 font-normal text-slate-500">({unit})</span> : null}
      </label>
      {children(id, describedBy)}
      {error ? (
        <p id={`${id}-error`} role="alert" className="text-sm text-danger-700">{error}</p>
      ) : hint ? (
        <p id={`${id}-hint`} className="text-sm text-slate-600">{hint}</p>
      ) : null}
    </div>
  );
}

type InputProps = InputHTMLAttributes<HTMLInputElement> & { label: string; error?: string; hint?: ReactNode; unit?: string };
export const TextField = forwardRef<HTMLInputElement, InputProps>(function TextField({ label, error, hint, unit, className = '', ...rest }, ref) {
  return (
    <FieldShell label={label} error={error} hint={hint} unit={unit}>
      {(id, describedBy) => (
        <input ref={ref} id={id} aria-invalid={!!error} aria-describedby={describedBy} className={`${inputClass} ${rest.type === 'number' ? 'num' : ''} ${className}`} {...rest} />
      )}
    </FieldShell>
  );
});

type SelectProps = SelectHTMLAttributes<HTMLSelectElement> & { label: string; error?: string; hint?: ReactNode; options: readonly { value: string; label: string }[] };
export const SelectField = forwardRef<HTMLSelectElement, SelectProps>(function SelectField({ label, error, hint, options, className = '', ...rest }, ref) {
  return (
    <FieldShell label={label} error={error} hint={hint}>
      {(id, describedBy) => (
        <select ref={ref} id={id} aria-invalid={!!error} aria-describedby={describedBy} className={`${inputClass} ${className}`} {...rest}>
          {options.map((o) => (
            <option key={o.value} value={o.value}>{o.label}</option>
          ))}
        </select>
      )}
    </FieldShell>
  );
});

type AreaProps = TextareaHTMLAttributes<HTMLTextAreaElement> & { label: string; error?: string; hint?: ReactNode };
export const TextAreaField = forwardRef<HTMLTextAreaElement, AreaProps>(function TextAreaField({ label, error, hint, ...rest }, ref) {
  return (
    <FieldShell label={label} error={error} hint={hint}>
      {(id, describedBy) => <textarea ref={ref} id={id} aria-invalid={!!error} aria-describedby={describedBy} className={`${inputClass} min-h-20`} {...rest} />}
    </FieldShell>
  );
});

export { inputClass };
