import type { ReactNode } from 'react';

/** The border and colours of a form control, red-edged when it has a problem. */
export function formControlClass(error: string | undefined): string {
  return `rounded-md border bg-white px-3 py-2 text-slate-900 shadow-sm outline-none focus-visible:ring-2 focus-visible:ring-teal-400 disabled:cursor-not-allowed disabled:opacity-60 dark:bg-slate-900 dark:text-slate-100 ${
    error ? 'border-ember-500' : 'border-slate-700/30 dark:border-slate-300/20'
  }`;
}

/** The ids a control points at with aria-describedby: its error and its hint, when it has them. */
export function describedByOf(id: string, error: string | undefined, hint: ReactNode): string | undefined {
  return [error ? `${id}-error` : null, hint ? `${id}-hint` : null].filter(Boolean).join(' ') || undefined;
}

/**
 * A labelled form field around one control (TextField, SelectField): the label, the control, a
 * hint, and room kept for the error message so that the form does not jump when one appears.
 */
export function FormField({ id, label, error, hint, className = '', children }: { id: string; label: string; error?: string; hint?: ReactNode; className?: string; children: ReactNode }) {
  return (
    <div className={`flex flex-col gap-1 ${className}`}>
      <label htmlFor={id} className="text-sm font-semibold text-slate-800 dark:text-slate-100">
        {label}
      </label>
      {children}
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
