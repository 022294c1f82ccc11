import type { ReactNode } from 'react';
import { DevMailboxLink } from '../../../components/dev-mailbox-link.tsx';

/** The frame of the signed-out pages: the name, one card, a quiet footer. */
export function AuthLayout({ title, intro, children, footer }: { title: string; intro?: ReactNode; children: ReactNode; footer?: ReactNode }) {
  return (
    <div className="flex min-h-screen flex-col items-center bg-paper px-4 py-10">
      <div className="mb-8 flex items-center gap-2">
        <img src="/favicon.svg" alt="" className="h-8 w-8" />
        <span className="text-xl font-semibold tracking-tight">Ohmstead</span>
      </div>
      <main id="main" className="w-full max-w-md rounded-xl border border-line bg-white/70 p-6 shadow-sm sm:p-8">
        <h1 id="page-title" className="text-2xl font-semibold tracking-tight">
          {title}
        </h1>
        {intro ? <div className="mt-2 text-graphite-soft">{intro}</div> : null}
        <div className="mt-6">{children}</div>
      </main>
      <footer className="mt-6 flex flex-col items-center gap-2 text-sm text-graphite-soft">
        {footer}
        <DevMailboxLink />
      </footer>
    </div>
  );
}
