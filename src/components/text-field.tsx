import { useId, type InputHTMLAttributes } from 'react';
import { describedByOf, FormField, formControlClass } from './form-field';

export interface TextFieldProps extends Omit<InputHTMLAttributes<HTMLInputElement>, 'id'> {
  label: string;
  /** The problem with this field, tied to it for screen readers. */
  error?: string;
  hint?: string;
}

/** A labelled input whose error and hint are announced with it (aria-describedby, aria-invalid). */
export function TextField({ label, error, hint, className, ...rest }: TextFieldProps) {
  const id = useId();
  return (
    <FormField id={id} label={label} error={error} hint={hint} className={className}>
      <input id={id} aria-invalid={error ? true : undefined} aria-describedby={describedByOf(id, error, hint)} className={formControlClass(error)} {...rest} />
    </FormField>
  );
}
