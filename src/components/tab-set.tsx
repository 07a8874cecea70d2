import { useId, useRef, useState, type KeyboardEvent, type ReactNode } from 'react';

export interface TabItem {
  id: string;
  label: string;
  /** Drawn only while its tab is chosen (a chart that is not seen costs nothing). */
  render: () => ReactNode;
}

/**
 * A row of tabs over one panel (the WAI-ARIA tabs pattern: arrow keys, Home and End move between
 * tabs). The chosen tab is remembered on this device when `storageKey` is given.
 */
export function TabSet({ label, tabs, storageKey, className = '' }: { label: string; tabs: readonly TabItem[]; storageKey?: string; className?: string }) {
  const baseId = useId();
  const [chosen, setChosen] = useState(() => {
    const stored = storageKey && typeof localStorage !== 'undefined' ? localStorage.getItem(storageKey) : null;
    return tabs.some((tab) => tab.id === stored) ? (stored as string) : tabs[0]?.id;
  });
  const buttons = useRef(new Map<string, HTMLButtonElement>());
  const choose = (id: string) => {
    setChosen(id);
    if (storageKey) {
      try {
        localStorage.setItem(storageKey, id);
      } catch {
        // Storage refused: remembered for this visit only.
      }
    }
  };
  const onKeyDown = (event: KeyboardEvent) => {
    const index = tabs.findIndex((tab) => tab.id === chosen);
    const next = { ArrowRight: index + 1, ArrowLeft: index - 1, Home: 0, End: tabs.length - 1 }[event.key];
    if (next === undefined) return;
    event.preventDefault();
    const tab = tabs[(next + tabs.length) % tabs.length];
    choose(tab.id);
    buttons.current.get(tab.id)?.focus();
  };
  const current = tabs.find((tab) => tab.id === chosen) ?? tabs[0];
  return (
    <div className={`flex min-h-0 flex-col ${className}`}>
      <div role="tablist" aria-label={label} className="flex shrink-0 gap-1 border-b border-slate-700/15 dark:border-slate-300/10" onKeyDown={onKeyDown}>
        {tabs.map((tab) => {
          const selected = tab.id === current?.id;
          return (
            <button
              key={tab.id}
              ref={(element) => {
                if (element) buttons.current.set(tab.id, element);
                else buttons.current.delete(tab.id);
              }}
              type="button"
              role="tab"
              id={`${baseId}-${tab.id}-tab`}
              aria-selected={selected}
              aria-controls={`${baseId}-${tab.id}-panel`}
              tabIndex={selected ? 0 : -1}
              onClick={() => choose(tab.id)}
              className={`-mb-px border-b-2 px-3 py-1.5 text-sm font-semibold focus-visible:outline-2 focus-visible:outline-teal-400 ${
                selected ? 'border-brass-500 text-slate-950 dark:text-slate-50' : 'border-transparent text-slate-600 hover:text-slate-900 dark:text-slate-400 dark:hover:text-slate-100'
              }`}
            >
              {tab.label}
            </button>
          );
        })}
      </div>
      {current && (
        <div role="tabpanel" id={`${baseId}-${current.id}-panel`} aria-labelledby={`${baseId}-${current.id}-tab`} className="min-h-0 flex-1 overflow-auto pt-2">
          {current.render()}
        </div>
      )}
    </div>
  );
}
