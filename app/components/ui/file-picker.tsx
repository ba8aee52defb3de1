import { useId, useState, type ReactNode, type Ref } from 'react';
import { FileUp } from 'lucide-react';

const looks = {
  primary: 'bg-accent-700 text-white hover:bg-accent-800',
  secondary: 'bg-white text-slate-900 border border-slate-400 hover:bg-slate-100',
} as const;

export interface FilePickerProps {
  /** Names the control for everyone (and for getByLabel); shown above it unless hideLabel. */
  label: string;
  /** The file types offered first, as the input's accept attribute (WHATWG HTML, "File Upload state"). */
  accept: string;
  /** The file chosen; called once per choice, and again when the same file is chosen again. */
  onFile: (file: File) => void;
  /** The name to show beside the button; left out, the last file chosen here is shown. `null` shows none chosen. */
  chosen?: string | null;
  /** What the button says; "Choose a file" by default. */
  buttonLabel?: string;
  hint?: ReactNode;
  disabled?: boolean;
  hideLabel?: boolean;
  variant?: keyof typeof looks;
  inputRef?: Ref<HTMLInputElement>;
}

/**
 * The one way a screen takes a file: a button in the app's look, 44 px tall (WCAG 2.2, 2.5.5 Target
 * Size), with the chosen file's name beside it. The browser's own file input lies over the button,
 * transparent, so a click, a tap, Tab then Space or Enter, and a screen reader all reach the real
 * control; the ring shows when it has the keyboard's focus. Its value is cleared after each choice so
 * choosing the same file again (after fixing it) is a new choice.
 */
export function FilePicker({ label, accept, onFile, chosen, buttonLabel = 'Choose a file', hint, disabled, hideLabel, variant = 'secondary', inputRef }: FilePickerProps) {
  const id = useId();
  const [picked, setPicked] = useState<string | null>(null);
  const name = chosen === undefined ? picked : chosen;
  const describedBy = `${id}-name${hint ? ` ${id}-hint` : ''}`;
  return (
    <div className="flex min-w-0 flex-col gap-1">
      <label htmlFor={id} className={hideLabel ? 'sr-only' : 'text-sm font-semibold text-slate-700'}>{label}</label>
      <div className="flex min-w-0 flex-wrap items-center gap-x-3 gap-y-1">
        <span className={`relative inline-flex min-h-11 min-w-11 shrink-0 items-center justify-center gap-2 rounded px-4 py-2 text-base font-semibold has-[:focus-visible]:outline-3 has-[:focus-visible]:outline-offset-2 has-[:focus-visible]:outline-[#2f4fae] has-[:focus-visible]:outline-solid ${disabled ? 'cursor-not-allowed bg-slate-100 text-slate-400 border border-slate-300' : looks[variant]}`}>
          <FileUp aria-hidden className="h-5 w-5" />
          <span aria-hidden>{buttonLabel}</span>
          <input ref={inputRef} id={id} type="file" accept={accept} disabled={disabled} aria-describedby={describedBy}
            className="absolute -inset-px h-[calc(100%+2px)] w-[calc(100%+2px)] cursor-pointer opacity-0 disabled:cursor-not-allowed"
            onChange={(e) => {
              const file = e.target.files?.[0];
              e.target.value = '';
              if (!file) return;
              setPicked(file.name);
              onFile(file);
            }} />
        </span>
        <span id={`${id}-name`} className={`min-w-0 break-all ${name ? 'font-mono text-[15px] text-slate-900' : 'text-slate-600'}`}>{name ?? 'No file chosen'}</span>
      </div>
      {hint ? <p id={`${id}-hint`} className="text-sm text-slate-600">{hint}</p> : null}
    </div>
  );
}
