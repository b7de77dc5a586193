import { useState } from 'react';
import { fieldError } from '../../../components/ui';
import { useOutbox, type OutboxMessage } from '../api/get-outbox';
import { Pager } from './pager';

const LIMIT = 15;
const when = (iso: string) => new Date(iso).toLocaleString('en-GB', { day: 'numeric', month: 'short', hour: '2-digit', minute: '2-digit', second: '2-digit' });

function Reader({ m }: { m: OutboxMessage }) {
  return (
    <article aria-labelledby="mail-subject" className="grid gap-2 rounded border border-rule bg-white p-3">
      <h3 id="mail-subject" className="font-bold">{m.subject}</h3>
      <dl className="grid grid-cols-[auto_1fr] gap-x-3 text-sm">
        <dt className="text-ink-soft">To</dt>
        <dd className="font-mono text-xs break-all" data-testid="mail-to">{m.to}</dd>
        <dt className="text-ink-soft">From</dt>
        <dd className="font-mono text-xs break-all">{m.from}</dd>
        <dt className="text-ink-soft">Received</dt>
        <dd>{when(m.receivedAt)}</dd>
      </dl>
      {/* Text only: mail bodies are shown as plain text, never rendered as markup. */}
      <pre className="max-h-96 overflow-auto whitespace-pre-wrap break-words border-t border-rule pt-2 font-mono text-xs" data-testid="mail-text">
        {m.text}
      </pre>
    </article>
  );
}

/** The mail the local catcher received, newest first; choose one to read it. */
export function Outbox() {
  const [offset, setOffset] = useState(0);
  const [openId, setOpenId] = useState<number | null>(null);
  const q = useOutbox(offset, LIMIT);
  if (q.isPending) return <p className="text-sm text-ink-soft">Loading the outbox…</p>;
  if (q.isError) return <p role="alert" className={fieldError}>The outbox could not be loaded: {q.error.message}</p>;
  const { messages, total } = q.data;
  if (total === 0) return <p className="text-sm text-ink-soft">No mail has been sent yet.</p>;
  const open = messages.find((m) => m.id === openId) ?? null;
  return (
    <div className="grid gap-3 lg:grid-cols-[2fr_3fr]">
      <div className="grid content-start gap-2">
        <ul className="grid gap-1" aria-label="Messages">
          {messages.map((m) => (
            <li key={m.id}>
              <button
                type="button"
                aria-current={m.id === openId ? 'true' : undefined}
                onClick={() => setOpenId(m.id)}
                className={`grid w-full gap-0.5 rounded border px-3 py-2 text-left text-sm hover:bg-signal-soft ${m.id === openId ? 'border-signal bg-signal-soft' : 'border-rule bg-white'}`}
              >
                <span className="font-bold">{m.subject}</span>
                <span className="truncate text-xs text-ink-soft">
                  to {m.to} · {when(m.receivedAt)}
                </span>
              </button>
            </li>
          ))}
        </ul>
        <Pager offset={offset} limit={LIMIT} total={total} onChange={(o) => { setOffset(o); setOpenId(null); }} label="Outbox pages" />
      </div>
      {open ? <Reader m={open} /> : <p className="text-sm text-ink-soft">Choose a message to read it.</p>}
    </div>
  );
}
