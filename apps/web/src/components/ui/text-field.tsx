import type { InputHTMLAttributes } from 'react';

/** A labelled input with a 44 px touch target and an optional hint or error under it. */
export function TextField({
  label,
  hint,
  error,
  className = '',
  ...rest
}: InputHTMLAttributes<HTMLInputElement> & { label: string; hint?: string; error?: string }) {
  return (
    <label className={`block ${className}`}>
      <span className="text-sm font-medium">{label}</span>
      <input className="mt-1 block min-h-11 w-full rounded-md border border-stone-500 bg-white px-3 text-base" aria-invalid={!!error} {...rest} />
      {hint && !error && <span className="block text-sm text-stone-700">{hint}</span>}
      {error && <span className="block text-sm text-high">{error}</span>}
    </label>
  );
}

/** The server's problem message for a failed request, announced to screen readers. */
export function ErrorNote({ error }: { error: Error | null }) {
  if (!error) return null;
  return (
    <p role="alert" className="rounded-md bg-red-50 p-2 text-sm text-high">
      {error.message}
    </p>
  );
}
