export interface SegmentedOption<T extends string> {
  value: T;
  label: string;
  disabled?: boolean;
}

/**
 * One of a few choices as a row of joined buttons (a radio group to assistive technology): the
 * canvas tool, the A/B side.
 */
export function SegmentedChoice<T extends string>({ label, options, value, onChange, keyShortcuts }: { label: string; options: ReadonlyArray<SegmentedOption<T>>; value: T; onChange: (value: T) => void; keyShortcuts?: string }) {
  return (
    <div role="radiogroup" aria-label={label} aria-keyshortcuts={keyShortcuts} className="flex overflow-hidden rounded-md border border-slate-700/30 text-sm dark:border-slate-300/20">
      {options.map((option) => (
        <button
          key={option.value}
          type="button"
          role="radio"
          aria-checked={value === option.value}
          disabled={option.disabled}
          onClick={() => onChange(option.value)}
          className={`px-3 py-1 disabled:opacity-50 ${value === option.value ? 'bg-teal-700 text-white dark:bg-teal-500 dark:text-slate-950' : ''}`}
        >
          {option.label}
        </button>
      ))}
    </div>
  );
}
