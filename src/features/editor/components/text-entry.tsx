import { useEffect, useId, useState } from 'react';

export interface TextEntryProps {
  label: string;
  /** What the field shows while nobody is typing in it. */
  value: string;
  /** The unit beside the field, if any. */
  unit?: string;
  hint?: string;
  disabled?: boolean;
  inputMode?: 'decimal' | 'text';
  /** Tailwind width of the input. */
  widthClass?: string;
  /** Apply the text even when it is what the field showed (a number re-typed re-applies it). */
  alwaysCommit?: boolean;
  /** Applies the typed text; returns a problem to show beside the field, or null when applied. */
  onCommit: (text: string) => string | null;
}

/** A field applied on Enter or leaving it (unchanged text applies nothing unless `alwaysCommit`), its problem shown once beside it. */
export function TextEntry({ label, value, unit, hint, disabled, inputMode = 'text', widthClass = 'w-28', alwaysCommit = false, onCommit }: TextEntryProps) {
  const id = useId();
  const [text, setText] = useState(value);
  const [editing, setEditing] = useState(false);
  const [problem, setProblem] = useState<string | null>(null);
  useEffect(() => {
    if (!editing) setText(value);
  }, [value, editing]);
  const commit = () => {
    setEditing(false);
    if (!alwaysCommit && text.trim() === value.trim()) return setProblem(null);
    const refused = onCommit(text);
    setProblem(refused);
    if (refused) setText(value);
  };
  return (
    <div className="flex flex-col gap-0.5">
      <label htmlFor={id} className="text-xs font-semibold text-slate-800 dark:text-slate-100">
        {label}
      </label>
      <div className="flex items-center gap-1">
        <input
          id={id}
          inputMode={inputMode}
          value={text}
          disabled={disabled}
          aria-invalid={problem ? true : undefined}
          aria-describedby={problem ? `${id}-problem` : hint ? `${id}-hint` : undefined}
          onFocus={() => setEditing(true)}
          onChange={(event) => setText(event.target.value)}
          onBlur={commit}
          onKeyDown={(event) => event.key === 'Enter' && (event.currentTarget as HTMLInputElement).blur()}
          className={`${widthClass} rounded border border-slate-700/30 bg-white px-2 py-1 text-sm tabular-nums focus-visible:ring-2 focus-visible:ring-teal-400 disabled:opacity-60 dark:border-slate-300/20 dark:bg-slate-900`}
        />
        {unit && <span className="text-xs text-slate-600 dark:text-slate-300">{unit}</span>}
      </div>
      {hint && !problem && (
        <p id={`${id}-hint`} className="max-w-56 text-xs text-slate-600 dark:text-slate-300">
          {hint}
        </p>
      )}
      {problem && (
        <p id={`${id}-problem`} role="alert" className="max-w-56 text-xs text-ember-600 dark:text-ember-400">
          {problem}
        </p>
      )}
    </div>
  );
}
