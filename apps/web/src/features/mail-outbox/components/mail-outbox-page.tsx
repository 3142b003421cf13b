import { useState } from 'react';
import { PageHeader } from '@/components/ui/page-header';
import { QueryState } from '@/components/ui/query-state';
import { useMail, useMailList } from '../api/get-mail';

function MailView({ id }: { id: string }) {
  const mail = useMail(id);
  return (
    <QueryState query={mail} label="the message">
      {(m) => (
        <article className="flex flex-col gap-2">
          <h2 className="text-xl font-semibold">{m.subject}</h2>
          <p className="text-sm">
            From {m.from} to {m.to.join(', ')} · {new Date(m.receivedAt).toLocaleString()}
          </p>
          {m.attachments.length > 0 && (
            <p className="text-sm">Attached: {m.attachments.map((a) => `${a.filename} (${a.contentType}, ${a.size} bytes)`).join(', ')}</p>
          )}
          {m.html && <iframe title={`HTML of ${m.subject}`} sandbox="" srcDoc={m.html} className="h-96 w-full rounded-md border border-stone-300 bg-white" />}
          {m.text && <pre className="overflow-auto whitespace-pre-wrap rounded-md border border-stone-300 bg-white p-3 text-sm">{m.text}</pre>}
        </article>
      )}
    </QueryState>
  );
}

/** Development only: the messages the local SMTP capture server received (nothing leaves the machine). */
export default function MailOutboxPage() {
  const list = useMailList();
  const [open, setOpen] = useState<string | null>(null);
  return (
    <div>
      <PageHeader title="Mail outbox (local capture)" />
      <p className="mb-3 text-stone-700">
        What the server sent to the local SMTP capture server. With a real mail relay configured, this page is empty and its API answers 404.
      </p>
      <div className="grid gap-4 lg:grid-cols-[minmax(0,1fr)_minmax(0,1.4fr)]">
        <QueryState query={list} label="captured mail">
          {(d) =>
            d.items.length ? (
              <ul className="flex flex-col gap-1">
                {d.items.map((m) => (
                  <li key={m.id}>
                    <button
                      type="button"
                      aria-pressed={open === m.id}
                      onClick={() => setOpen(m.id)}
                      className={`min-h-11 w-full rounded-md border px-3 py-2 text-left ${open === m.id ? 'border-board bg-teal-50' : 'border-stone-300 bg-white hover:bg-stone-50'}`}
                    >
                      <span className="block font-semibold">{m.subject}</span>
                      <span className="block text-sm text-stone-700">
                        {m.to.join(', ')} · {new Date(m.receivedAt).toLocaleString()}
                        {m.attachments.length ? ` · ${m.attachments.length} attachment(s)` : ''}
                      </span>
                    </button>
                  </li>
                ))}
              </ul>
            ) : (
              <p>No mail captured yet.</p>
            )
          }
        </QueryState>
        <div>{open ? <MailView id={open} /> : <p className="text-stone-700">Pick a message to read it.</p>}</div>
      </div>
    </div>
  );
}
