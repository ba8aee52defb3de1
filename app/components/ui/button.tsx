import type { ButtonHTMLAttributes } from 'react';

type Variant = 'primary' | 'secondary' | 'danger' | 'ghost';
const styles: Record<Variant, string> = {
  primary: 'bg-accent-700 text-white hover:bg-accent-800 disabled:bg-slate-400',
  secondary: 'bg-white text-slate-900 border border-slate-400 hover:bg-slate-100 disabled:text-slate-400',
  danger: 'bg-white text-danger-700 border border-danger-700 hover:bg-danger-50 disabled:text-slate-400 disabled:border-slate-300',
  ghost: 'text-accent-700 hover:bg-accent-50 disabled:text-slate-400',
};

export function Button({ variant = 'primary', className = '', type = 'button', ...rest }: ButtonHTMLAttributes<HTMLButtonElement> & { variant?: Variant }) {
  return (
    <button
      type={type}
      className={`inline-flex min-h-10 items-center justify-center gap-2 rounded px-4 py-2 text-base font-semibold disabled:cursor-not-allowed ${styles[variant]} ${className}`}
      {...rest}
    />
  );
}
