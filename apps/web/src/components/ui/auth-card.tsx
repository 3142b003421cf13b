import type { ReactNode } from 'react';

/** The frame of the signed-out pages: sign-in, first run, invitation, password reset. */
export function AuthCard({ title, subtitle, children, wide = false }: { title: string; subtitle?: string; children: ReactNode; wide?: boolean }) {
  return (
    <main className="flex min-h-full flex-1 items-center justify-center bg-board p-4">
      <div className={`w-full ${wide ? 'max-w-2xl' : 'max-w-sm'} rounded-xl bg-white p-6 shadow-xl sm:p-8`}>
        <div className="mb-6 flex items-center gap-3">
          <img src="/favicon.svg" alt="" className="h-10 w-10" />
          <div>
            <h1 className="text-2xl font-semibold">{title}</h1>
            {subtitle && <p className="text-sm text-stone-600">{subtitle}</p>}
          </div>
        </div>
        {children}
      </div>
    </main>
  );
}
