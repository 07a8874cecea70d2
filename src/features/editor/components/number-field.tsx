import { TextEntry } from './text-entry';

export interface NumberFieldProps {
  label: string;
  unit: string;
  value: number;
  /** Shown with this many significant digits. */
  digits?: number;
  disabled?: boolean;
  /** Returns a problem to show, or null when the value was applied. */
  onCommit: (value: number) => string | null;
  hint?: string;
}

/** A typed number with its unit; applied on Enter or leaving the field, refused with a reason if out of range. */
export function NumberField({ label, unit, value, digits = 5, disabled, onCommit, hint }: NumberFieldProps) {
  return (
    <TextEntry
      label={label}
      unit={unit}
      value={format(value, digits)}
      hint={hint}
      disabled={disabled}
      inputMode="decimal"
      alwaysCommit
      onCommit={(text) => {
        const parsed = Number(text.replace(',', '.'));
        return text.trim() !== '' && Number.isFinite(parsed) ? onCommit(parsed) : 'Enter a number';
      }}
    />
  );
}

function format(value: number, digits: number): string {
  return Number.isFinite(value) ? String(Number(value.toPrecision(digits))) : '';
}
