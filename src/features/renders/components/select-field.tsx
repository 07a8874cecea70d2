import { useId, type ReactNode, type SelectHTMLAttributes } from 'react';

export interface SelectFieldProps extends Omit<SelectHTMLAttributes<HTMLSelectElement>, 'id'> {
  label: string;
  /** The problem with this field, tied to it for screen readers. */
  error?: string;
  /** One short line explaining the current choice. */
  hint?: ReactNode;
  children: ReactNode;
}

/** A labelled menu laid out like TextField: its hint and error are announced with it. */
export function SelectField({ label, error, hint, className = '', children, ...rest }: SelectFieldProps) {
  const id = useId();
  const describedBy = [error ? `${id}-error` : null, hint ? `${id}-hint` : null].filter(Boolean).join(' ') || undefined;
  return (
    <div className={`flex flex-col gap-1 ${className}`}>
      <label htmlFor={id} className="text-sm font-semibold text-slate-800 dark:text-slate-100">
        {label}
      </label>
      <select
        id={id}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy}
        className={`rounded-md border bg-white px-3 py-2 text-slate-900 shadow-sm outline-none focus-visible:ring-2 focus-visible:ring-teal-400 disabled:cursor-not-allowed disabled:opacity-60 dark:bg-slate-900 dark:text-slate-100 ${
          error ? 'border-ember-500' : 'border-slate-700/30 dark:border-slate-300/20'
        }`}
        {...rest}
      >
        {children}
      </select>
      {hint && (
        <p id={`${id}-hint`} className="text-xs text-slate-600 dark:text-slate-300">
          {hint}
        </p>
      )}
      <p id={`${id}-error`} role={error ? 'alert' : undefined} className="min-h-5 text-sm text-ember-600 dark:text-ember-400">
        {error ?? ''}
      </p>
    </div>
  );
}
