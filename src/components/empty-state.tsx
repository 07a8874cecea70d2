import type { ReactNode } from 'react';

export function EmptyState({ title, children }: { title: string; children?: ReactNode }) {
  return (
    <div className="rounded-lg border border-dashed border-slate-700/30 px-6 py-10 text-center dark:border-slate-300/20">
      <p className="font-semibold">{title}</p>
      {children && <div className="mt-2 text-sm text-slate-700 dark:text-slate-300">{children}</div>}
    </div>
  );
}
