import type { ButtonHTMLAttributes } from 'react';

type Variant = 'primary' | 'secondary' | 'danger' | 'ghost';

const variants: Record<Variant, string> = {
  primary: 'bg-brass-500 text-slate-950 hover:bg-brass-400 disabled:bg-brass-500/50',
  secondary: 'border border-slate-700/30 bg-white text-slate-900 hover:bg-white dark:border-slate-300/20 dark:bg-slate-800 dark:text-slate-100 dark:hover:bg-slate-700',
  danger: 'bg-ember-600 text-white hover:bg-ember-500 disabled:bg-ember-600/50',
  ghost: 'text-slate-700 hover:bg-slate-700/10 dark:text-slate-300 dark:hover:bg-slate-100/10',
};

export interface ButtonProps extends ButtonHTMLAttributes<HTMLButtonElement> {
  variant?: Variant;
  /** Shows progress and blocks a second press. */
  busy?: boolean;
  /** Why the button is disabled, shown on hover and read by screen readers. */
  disabledReason?: string;
}

/** The one button: visible focus ring, a busy state, and a reason when it cannot be pressed. */
export function Button({ variant = 'primary', busy = false, disabledReason, disabled, className = '', children, ...rest }: ButtonProps) {
  const isDisabled = disabled || busy || disabledReason !== undefined;
  return (
    <button
      type="button"
      {...rest}
      disabled={isDisabled}
      aria-busy={busy || undefined}
      title={disabledReason ?? rest.title}
      aria-description={disabledReason}
      className={`inline-flex items-center justify-center gap-2 rounded-md px-4 py-2 text-sm font-semibold transition-colors focus-visible:outline-2 focus-visible:outline-offset-2 focus-visible:outline-teal-400 disabled:cursor-not-allowed disabled:opacity-60 ${variants[variant]} ${className}`}
    >
      {busy && <span className="size-3 animate-spin rounded-full border-2 border-current border-t-transparent" aria-hidden="true" />}
      {children}
    </button>
  );
}
