import { useId } from 'react';
import { ROLES, type Role } from '../../../../shared/access/roles';
import { ROLE_NAMES } from '../role-words';

export interface RoleSelectProps {
  label: string;
  /** Shows the label above the select; otherwise it is read by screen readers only. */
  showLabel?: boolean;
  value: Role;
  onChange: (role: Role) => void;
  /** Why the role cannot be changed: the select is disabled and says why on hover and to screen readers. */
  disabledReason?: string;
  busy?: boolean;
  /** A line under the select, tied to it for screen readers. */
  hint?: string;
  className?: string;
}

/** A role picker with the same look and focus ring as the text fields. */
export function RoleSelect({ label, showLabel = false, value, onChange, disabledReason, busy = false, hint, className = '' }: RoleSelectProps) {
  const id = useId();
  return (
    <div className={`flex flex-col gap-1 ${className}`}>
      <label htmlFor={id} className={showLabel ? 'text-sm font-semibold text-slate-800 dark:text-slate-100' : 'sr-only'}>
        {label}
      </label>
      <div className="flex items-center gap-2">
        <select
          id={id}
          value={value}
          onChange={(event) => onChange(event.target.value as Role)}
          disabled={busy || disabledReason !== undefined}
          aria-busy={busy || undefined}
          title={disabledReason}
          aria-description={disabledReason}
          aria-describedby={hint ? `${id}-hint` : undefined}
          className="rounded-md border border-slate-700/30 bg-white px-2 py-2 text-sm text-slate-900 shadow-sm outline-none focus-visible:ring-2 focus-visible:ring-teal-400 disabled:cursor-not-allowed disabled:opacity-60 dark:border-slate-300/20 dark:bg-slate-900 dark:text-slate-100"
        >
          {ROLES.map((role) => (
            <option key={role} value={role}>
              {ROLE_NAMES[role]}
            </option>
          ))}
        </select>
        {/* Kept in the layout at all times so the row does not move when a change starts. */}
        <span className={`size-3 rounded-full border-2 border-current border-t-transparent ${busy ? 'animate-spin' : 'invisible'}`} aria-hidden="true" />
      </div>
      {hint && (
        <p id={`${id}-hint`} className="text-xs text-slate-600 dark:text-slate-300">
          {hint}
        </p>
      )}
    </div>
  );
}
