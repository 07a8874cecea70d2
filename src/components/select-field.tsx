import { useId, type ReactNode, type SelectHTMLAttributes } from 'react';
import { describedByOf, FormField, formControlClass } from './form-field';

export interface SelectFieldProps extends Omit<SelectHTMLAttributes<HTMLSelectElement>, 'id'> {
  label: string;
  /** The problem with this field, tied to it for screen readers. */
  error?: string;
  /** One short line explaining the current choice. */
  hint?: ReactNode;
  children: ReactNode;
}

/** A labelled menu laid out like TextField: its hint and error are announced with it. */
export function SelectField({ label, error, hint, className, children, ...rest }: SelectFieldProps) {
  const id = useId();
  return (
    <FormField id={id} label={label} error={error} hint={hint} className={className}>
      <select id={id} aria-invalid={error ? true : undefined} aria-describedby={describedByOf(id, error, hint)} className={formControlClass(error)} {...rest}>
        {children}
      </select>
    </FormField>
  );
}
