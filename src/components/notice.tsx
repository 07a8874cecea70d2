import type { ReactNode } from 'react';

type Tone = 'info' | 'error' | 'success' | 'caution';

const tones: Record<Tone, string> = {
  info: 'border-teal-600/40 bg-teal-400/10 text-slate-900 dark:text-slate-100',
  error: 'border-ember-500/50 bg-ember-500/10 text-ember-700 dark:text-ember-300',
  success: 'border-teal-600/50 bg-teal-400/15 text-slate-900 dark:text-slate-100',
  caution: 'border-brass-500/60 bg-brass-400/15 text-slate-900 dark:text-slate-100',
};

/** A message in the page: errors are announced at once, others politely. */
export function Notice({ tone = 'info', title, children }: { tone?: Tone; title?: string; children?: ReactNode }) {
  return (
    <div role={tone === 'error' ? 'alert' : 'status'} className={`rounded-md border px-4 py-3 text-sm ${tones[tone]}`}>
      {title && <p className="font-semibold">{title}</p>}
      {children && <div className={title ? 'mt-1' : ''}>{children}</div>}
    </div>
  );
}
