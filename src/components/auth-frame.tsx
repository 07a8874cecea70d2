import type { ReactNode } from 'react';
import { ThemeToggle } from './theme-toggle';

/** The frame of the signed-out pages: a narrow card under the brand. */
export function AuthFrame({ title, children }: { title: string; children: ReactNode }) {
  return (
    <div className="min-h-screen">
      <div className="flex justify-end px-4 py-3">
        <ThemeToggle />
      </div>
      <main id="main" className="mx-auto w-full max-w-md px-6 pb-16">
        <p className="text-sm font-semibold uppercase tracking-widest text-brass-600 dark:text-brass-400">Tautline</p>
        <h1 className="mt-1 text-3xl font-semibold">{title}</h1>
        <div className="mt-6 rounded-xl border border-slate-700/15 bg-white/80 p-6 shadow-sm dark:border-slate-300/10 dark:bg-slate-900">{children}</div>
      </main>
    </div>
  );
}
