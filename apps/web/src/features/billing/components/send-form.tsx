import type { Sent } from '@splitscope/contract';
import { useId, useState, type FormEvent } from 'react';
import { Button } from '@/components/ui/button';
import { dateTime } from '@/lib/format';

interface Props {
  label: string;
  defaultTo: string | null;
  pending: boolean;
  error: Error | null;
  sent: Sent | undefined;
  onSend: (to: string | undefined) => void;
}

/** An address (the customer's on file unless changed) and a send button; says where the mail went. */
export function SendForm({ label, defaultTo, pending, error, sent, onSend }: Props) {
  const id = useId();
  const [to, setTo] = useState(defaultTo ?? '');
  const submit = (e: FormEvent) => {
    e.preventDefault();
    onSend(to.trim() && to.trim() !== defaultTo ? to.trim() : undefined);
  };
  return (
    <form onSubmit={submit} className="flex flex-wrap items-end gap-2">
      <label htmlFor={`${id}-to`} className="min-w-64 flex-1">
        <span className="text-sm font-medium">Customer e-mail</span>
        <input
          id={`${id}-to`}
          type="email"
          autoComplete="off"
          value={to}
          onChange={(e) => setTo(e.target.value)}
          placeholder="name@example.com"
          className="block min-h-11 w-full rounded-md border border-stone-500 bg-white px-3"
        />
      </label>
      <Button type="submit" disabled={pending || !to.trim()}>
        {pending ? 'Sending…' : label}
      </Button>
      <div className="basis-full" aria-live="polite">
        {error && (
          <p role="alert" className="text-sm text-high">
            {error.message}
          </p>
        )}
        {sent && !error && (
          <p className="text-sm font-semibold text-ok">
            Sent to {sent.to} at {dateTime(sent.sentAt)}.
          </p>
        )}
      </div>
    </form>
  );
}
