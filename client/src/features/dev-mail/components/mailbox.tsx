/**
 * Development only: the e-mails the local mail catcher received for people of this organisation,
 * so invitations and password resets can be followed without a real mailbox.
 */
import { useState, type ReactNode } from 'react';
import { ApiError } from '@client/lib/api-client';
import { Button } from '@client/components/ui/button';
import { useMail, useMailList } from '../api/get-mail';
import { formatUtc } from '@shared/review/time-words';
import { EmailText } from '@client/components/ui/email-text';

/** Plain text with its addresses made clickable. */
function Linked({ text }: { text: string }) {
  const parts: ReactNode[] = [];
  let last = 0;
  for (const m of text.matchAll(/https?:\/\/\S+/g)) {
    parts.push(text.slice(last, m.index));
    parts.push(
      <a key={m.index} href={m[0]} className="break-all font-bold text-sea underline">
        {m[0]}
      </a>,
    );
    last = (m.index ?? 0) + m[0].length;
  }
  parts.push(text.slice(last));
  return <>{parts}</>;
}

function Message({ id }: { id: string }) {
  const mail = useMail(id);
  const [view, setView] = useState<'text' | 'html'>('text');
  if (!mail.data) return <p role="status">{mail.isError ? mail.error.message : 'Opening…'}</p>;
  const m = mail.data;
  return (
    <article className="rounded-xl border border-line bg-card p-4" aria-label="Message">
      <h2 className="text-xl">{m.subject}</h2>
      <p className="text-sm text-ink-soft">
        To {m.to.join(', ')} · from {m.from} · {formatUtc(m.receivedAt)}
      </p>
      <div className="mt-2 flex gap-2" role="group" aria-label="Show as">
        {(['text', 'html'] as const).map((v) => (
          <Button key={v} tone={view === v ? 'primary' : 'secondary'} aria-pressed={view === v} onClick={() => setView(v)}>
            {v === 'text' ? 'Plain text' : 'HTML'}
          </Button>
        ))}
      </div>
      {view === 'text' ? (
        <pre className="mt-3 font-sans whitespace-pre-wrap" data-testid="mail-text">
          <Linked text={m.text} />
        </pre>
      ) : (
        <iframe title="HTML version" sandbox="" srcDoc={m.html} className="mt-3 h-[28rem] w-full rounded border border-line bg-paper" />
      )}
    </article>
  );
}

export function Mailbox() {
  const list = useMailList();
  const [selected, setSelected] = useState<string | null>(null);
  const off = list.error instanceof ApiError && list.error.status === 404;
  return (
    <main className="mx-auto max-w-6xl space-y-4 p-3 sm:p-6">
      <div className="flex flex-wrap items-end justify-between gap-2">
        <div>
          <h1 className="text-3xl">Development mailbox</h1>
          <p className="text-ink-soft">E-mails the local mail catcher received from your firm: all of them for an admin, the master’s briefs you sent for an engineer. Not available in production.</p>
        </div>
        <Button tone="secondary" onClick={() => void list.refetch()}>
          Check again
        </Button>
      </div>
      {off && <p>The development mailbox is off on this server.</p>}
      {list.isError && !off && <p role="alert">{list.error.message}</p>}
      {list.data && list.data.messages.length === 0 && <p>No messages yet.</p>}
      {list.data && list.data.messages.length > 0 && (
        <div className="grid gap-4 md:grid-cols-[minmax(0,20rem)_1fr]">
          <ul className="space-y-2" aria-label="Messages">
            {list.data.messages.map((m) => (
              <li key={m.id}>
                <button
                  type="button"
                  onClick={() => setSelected(m.id)}
                  aria-current={selected === m.id ? 'true' : undefined}
                  className={`block min-h-touch w-full rounded-lg border-2 p-2 text-left ${selected === m.id ? 'border-hull bg-sea-soft' : 'border-line bg-card'}`}
                >
                  <span className="block font-bold">{m.subject}</span>
                  <span className="block text-sm text-ink-soft">
                    <EmailText email={m.to.join(', ')} /> · {formatUtc(m.receivedAt)}
                  </span>
                </button>
              </li>
            ))}
          </ul>
          {selected ? <Message id={selected} /> : <p className="text-ink-soft">Choose a message.</p>}
        </div>
      )}
    </main>
  );
}
