import { useEffect, useId, useState } from 'react';

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
  const id = useId();
  const [text, setText] = useState(() => format(value, digits));
  const [problem, setProblem] = useState<string | null>(null);
  const [editing, setEditing] = useState(false);
  useEffect(() => {
    if (!editing) setText(format(value, digits));
  }, [value, digits, editing]);
  const commit = () => {
    setEditing(false);
    const parsed = Number(text.replace(',', '.'));
    if (!Number.isFinite(parsed)) return setProblem('Enter a number');
    const refused = onCommit(parsed);
    setProblem(refused);
    if (refused) setText(format(value, digits));
  };
  return (
    <div className="flex flex-col gap-0.5">
      <label htmlFor={id} className="text-xs font-semibold text-slate-800 dark:text-slate-100">
        {label}
      </label>
      <div className="flex items-center gap-1">
        <input
          id={id}
          inputMode="decimal"
          value={text}
          disabled={disabled}
          aria-invalid={problem ? true : undefined}
          aria-describedby={problem ? `${id}-problem` : hint ? `${id}-hint` : undefined}
          onFocus={() => setEditing(true)}
          onChange={(event) => setText(event.target.value)}
          onBlur={commit}
          onKeyDown={(event) => event.key === 'Enter' && (event.currentTarget as HTMLInputElement).blur()}
          className="w-28 rounded border border-slate-700/30 bg-white px-2 py-1 text-sm tabular-nums focus-visible:ring-2 focus-visible:ring-teal-400 disabled:opacity-60 dark:border-slate-300/20 dark:bg-slate-900"
        />
        <span className="text-xs text-slate-600 dark:text-slate-300">{unit}</span>
      </div>
      {hint && !problem && (
        <p id={`${id}-hint`} className="text-xs text-slate-600 dark:text-slate-300">
          {hint}
        </p>
      )}
      {problem && (
        <p id={`${id}-problem`} role="alert" className="text-xs text-ember-600 dark:text-ember-400">
          {problem}
        </p>
      )}
    </div>
  );
}

function format(value: number, digits: number): string {
  return Number.isFinite(value) ? String(Number(value.toPrecision(digits))) : '';
}
