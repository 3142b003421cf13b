import type { Sent } from '@splitscope/contract';
import { useId, type FormEvent } from 'react';
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

/**
 * The customer's address on file and a send button; says where the mail went. The mail carries a link that
 * answers quotes as the customer, so it goes to the address on file only (the server refuses any other).
 */
export function SendForm({ label, defaultTo, pending, error, sent, onSend }: Props) {
  const id = useId();
  const to = defaultTo ?? '';
  const submit = (e: FormEvent) => {
    e.preventDefault();
    onSend(undefined);
  };
  return (
    <form onSubmit={submit} className="flex flex-wrap items-end gap-2">
      <label htmlFor={`${id}-to`} className="min-w-64 flex-1">
        <span className="text-sm font-medium">Customer e-mail</span>
        <input
          id={`${id}-to`}
          type="email"
          readOnly
          aria-describedby={`${id}-hint`}
          value={to}
          placeholder="none on file"
          className="block min-h-11 w-full rounded-md border border-stone-500 bg-stone-100 px-3"
        />
        <span id={`${id}-hint`} className="text-sm text-stone-700">
          {to ? 'Sent to the address on file only; change it on the customer.' : 'No e-mail on file: add one on the customer first.'}
        </span>
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
