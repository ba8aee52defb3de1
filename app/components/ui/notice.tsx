import { AlertOctagon, AlertTriangle, CheckCircle2, Info, ShieldAlert } from 'lucide-react';
import type { ReactNode } from 'react';

type Tone = 'danger' | 'warning' | 'caution' | 'safe' | 'info';
const tones: Record<Tone, { box: string; Icon: typeof Info }> = {
  danger: { box: 'border-danger-700 bg-danger-50 text-danger-700', Icon: AlertOctagon },
  warning: { box: 'border-warning-700 bg-warning-50 text-warning-700', Icon: AlertTriangle },
  caution: { box: 'border-caution-400 bg-caution-50 text-caution-800', Icon: ShieldAlert },
  safe: { box: 'border-safe-700 bg-safe-50 text-safe-700', Icon: CheckCircle2 },
  info: { box: 'border-slate-300 bg-white text-slate-800', Icon: Info },
};

/** A status said in words first, with an icon; the color only reinforces it. */
export function Notice({ tone, title, children }: { tone: Tone; title: string; children?: ReactNode }) {
  const { box, Icon } = tones[tone];
  return (
    <div role={tone === 'danger' ? 'alert' : 'status'} className={`flex gap-3 rounded border-l-4 p-3 ${box}`}>
      <Icon aria-hidden className="mt-0.5 h-5 w-5 shrink-0" />
      <div>
        <p className="font-semibold">{title}</p>
        {children ? <div className="text-slate-800">{children}</div> : null}
      </div>
    </div>
  );
}

export function ErrorText({ error }: { error: unknown }) {
  if (!error) return null;
  const message = error instanceof Error ? error.message : String(error);
  return <Notice tone="danger" title={message} />;
}
