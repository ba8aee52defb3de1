import type { ReactNode } from 'react';

/** A page outside the signed-in layout (set a password, forgot a password): one card, centered. */
export function CardPage({ title, subtitle, children }: { title: string; subtitle?: ReactNode; children: ReactNode }) {
  return (
    <main className="flex min-h-screen items-center justify-center bg-slate-100 p-4">
      <div className="w-full max-w-md rounded border border-slate-300 bg-white p-6">
        <div className="mb-6 flex items-center gap-3">
          <img src="/favicon.svg" alt="" className="h-10 w-10" />
          <div>
            <h1 className="text-2xl font-semibold">{title}</h1>
            {subtitle ? <p className="text-slate-600">{subtitle}</p> : null}
          </div>
        </div>
        {children}
      </div>
    </main>
  );
}
