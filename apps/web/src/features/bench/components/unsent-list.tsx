import type { UnsentReading } from '@/lib/use-reading-sender';

/** Readings kept on this device that the server does not have yet. */
export function UnsentList({
  unsent,
  rejected,
  onRetry,
  onDismiss,
}: {
  unsent: UnsentReading[];
  rejected: { raw: string; message: string }[];
  onRetry: () => void;
  onDismiss: () => void;
}) {
  if (unsent.length === 0 && rejected.length === 0) return null;
  return (
    <div className="space-y-2" aria-live="polite">
      {unsent.length > 0 && (
        <section role="status" className="rounded-md border-2 border-amber-600 bg-amber-50 p-2 text-sm text-amber-950" data-testid="unsent">
          <p className="font-semibold">
            {unsent.length} reading{unsent.length > 1 ? 's' : ''} not sent yet — kept on this device and re-sent when the connection returns
          </p>
          <ul className="my-1 list-disc pl-5">
            {unsent.map((u) => (
              <li key={u.key}>
                <span className="font-mono">{u.body.raw}</span> at {u.body.red} ({u.body.mode}, power {u.body.power})
                {u.attempts > 0 ? ` · tried ${u.attempts}×` : ''}
              </li>
            ))}
          </ul>
          <button type="button" onClick={onRetry} className="min-h-11 rounded-md border border-amber-700 bg-white px-3 font-semibold">
            Send now
          </button>
        </section>
      )}
      {rejected.length > 0 && (
        <section role="alert" className="rounded-md border border-high bg-red-50 p-2 text-sm text-high">
          <p className="font-semibold">The server refused these readings:</p>
          <ul className="list-disc pl-5">
            {rejected.map((r, i) => (
              <li key={i}>
                <span className="font-mono">{r.raw}</span>: {r.message}
              </li>
            ))}
          </ul>
          <button type="button" onClick={onDismiss} className="min-h-11 rounded-md border border-high bg-white px-3 font-semibold">
            Dismiss
          </button>
        </section>
      )}
    </div>
  );
}
