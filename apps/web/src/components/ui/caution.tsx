import type { ReactNode } from 'react';

/** A high-voltage or safety caution. Shape (the triangle) and words carry it, not only colour. */
export function Caution({ title, children, tone = 'danger' }: { title: string; children?: ReactNode; tone?: 'danger' | 'warn' }) {
  const box = tone === 'danger' ? 'border-high bg-red-50 text-red-950' : 'border-amber-600 bg-amber-50 text-amber-950';
  return (
    <div role="note" className={`flex gap-3 rounded-md border-l-4 p-3 ${box}`}>
      <svg viewBox="0 0 24 24" width="28" height="28" aria-hidden className="shrink-0">
        <path d="M12 2 23 21H1Z" fill="#f5c542" stroke="#111" strokeWidth="1.5" strokeLinejoin="round" />
        <path d="M13 7 9 14h3l-1 5 4-7h-3z" fill="#111" />
      </svg>
      <div className="space-y-1 text-sm">
        <p className="font-semibold">{title}</p>
        {children}
      </div>
    </div>
  );
}
