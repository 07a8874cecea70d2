import { useEffect, useId, useRef, type ReactNode } from 'react';

export interface ActionPanelProps {
  title: ReactNode;
  onClose: () => void;
  children: ReactNode;
  /** Move focus to the title when the panel opens; forms pass false and focus their first field. */
  focusTitle?: boolean;
  tone?: 'neutral' | 'danger';
}

/** The panel a row action opens above the table: titled for screen readers, closed with Escape. */
export function ActionPanel({ title, onClose, children, focusTitle = true, tone = 'neutral' }: ActionPanelProps) {
  const id = useId();
  const heading = useRef<HTMLHeadingElement>(null);
  useEffect(() => {
    if (focusTitle) heading.current?.focus();
  }, [focusTitle]);
  return (
    <section
      aria-labelledby={id}
      onKeyDown={(event) => {
        if (event.key === 'Escape') {
          event.stopPropagation();
          onClose();
        }
      }}
      className={`mb-6 rounded-lg border p-4 ${tone === 'danger' ? 'border-ember-500/50' : 'border-brass-500/40'}`}
    >
      <h2 id={id} ref={heading} tabIndex={-1} className="font-semibold outline-none focus-visible:outline-2 focus-visible:outline-teal-400">
        {title}
      </h2>
      <div className="mt-3">{children}</div>
    </section>
  );
}
