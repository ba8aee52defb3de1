import { useState } from 'react';
import { Mail } from 'lucide-react';
import type { OutboxMail } from '../../../../shared/schemas/outbox';
import { TextField } from '../../../components/ui/field';
import { ErrorText } from '../../../components/ui/notice';
import { useOutbox } from '../api';

const URL_PATTERN = /(https?:\/\/[^\s<>"]+)/g;

/** The text as written, with its web addresses made clickable (only http and https, so nothing else can run). */
function MailText({ text }: { text: string }) {
  const parts = text.split(URL_PATTERN);
  return (
    <pre className="whitespace-pre-wrap rounded border border-slate-200 bg-slate-50 p-3 font-mono text-sm text-slate-900 [overflow-wrap:anywhere]">
      {parts.map((part, i) =>
        i % 2 === 1 ? <a key={i} href={part} className="text-accent-700 underline">{part}</a> : <span key={i}>{part}</span>,
      )}
    </pre>
  );
}

function MailCard({ mail }: { mail: OutboxMail }) {
  return (
    <article aria-labelledby={`mail-${mail.id}`} className="flex flex-col gap-2 rounded border border-slate-300 bg-white p-4">
      <header className="flex flex-wrap items-baseline justify-between gap-x-4 gap-y-1">
        <h2 id={`mail-${mail.id}`} className="flex items-center gap-2 text-lg font-semibold">
          <Mail aria-hidden className="h-5 w-5 text-slate-500" /> {mail.subject}
        </h2>
        <p className="text-sm text-slate-600">
          To <span className="font-semibold text-slate-800">{mail.to}</span> · sent <time dateTime={mail.sentAt}>{new Date(mail.sentAt).toLocaleString()}</time>
        </p>
      </header>
      <MailText text={mail.text} />
    </article>
  );
}

export function OutboxList() {
  const [q, setQ] = useState('');
  const outbox = useOutbox(q.trim());
  const items = outbox.data?.items ?? [];
  const total = outbox.data?.total ?? 0;
  return (
    <div className="flex flex-col gap-4">
      <div className="max-w-sm">
        <TextField label="Find by address or subject" value={q} onChange={(e) => setQ(e.target.value)} />
      </div>
      <ErrorText error={outbox.error} />
      {outbox.data ? (
        <p className="text-slate-700" aria-live="polite">
          {total === 0 ? 'No mail yet.' : items.length < total ? `The newest ${items.length} of ${total} mails.` : `${total} mail${total === 1 ? '' : 's'}.`}
        </p>
      ) : outbox.isPending ? <p>Loading…</p> : null}
      {items.map((m) => <MailCard key={m.id} mail={m} />)}
    </div>
  );
}
