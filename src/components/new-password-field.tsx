import { PASSWORD_RULES_HINT } from '../lib/password-rules';
import { TextField } from './text-field';

export interface NewPasswordFieldProps {
  /** "Password" where an account is made, "New password" where one is changed. */
  label: string;
  value: string;
  onValueChange: (value: string) => void;
  /** The rule the password breaks, found in the browser before sending (passwordProblem); shown first. */
  weakness: string | null;
  /** The server's word on this field, if it blamed it. */
  serverError: string | undefined;
  autoFocus?: boolean;
}

/**
 * Where a password is chosen (registering, joining by invitation, a reset, a change): a password
 * field that password managers offer to fill, with the rules beneath it.
 */
export function NewPasswordField({ label, value, onValueChange, weakness, serverError, autoFocus }: NewPasswordFieldProps) {
  return (
    <TextField
      label={label}
      type="password"
      autoComplete="new-password"
      value={value}
      onChange={(event) => onValueChange(event.target.value)}
      error={weakness ?? serverError}
      hint={PASSWORD_RULES_HINT}
      autoFocus={autoFocus}
    />
  );
}
