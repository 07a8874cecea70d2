import { useEffect, useRef, useState } from 'react';
import { Button } from './button';

export interface ConfirmActionProps {
  /** The first button's text, e.g. "Remove". */
  label: string;
  /** Its accessible name when the text alone is ambiguous in a table, e.g. "Remove Tamsin Okafor". */
  ariaLabel?: string;
  /** The question asked before acting, e.g. "Remove Tamsin Okafor from the studio?". */
  question: string;
  /** The confirming button's text, e.g. "Yes, remove". */
  confirmLabel: string;
  /** The withdrawing button's text; "Cancel" unless given. */
  cancelLabel?: string;
  /** Shows the question beside the buttons, not only on hover. */
  showQuestion?: boolean;
  onConfirm: () => void;
  busy?: boolean;
  disabledReason?: string;
  describedBy?: string;
}

/**
 * A destructive action in two steps: the button turns into a confirm and a cancel button, grouped
 * under the question. Focus goes to cancel when the question appears, and back to the button when it is withdrawn.
 */
export function ConfirmAction({ label, ariaLabel, question, confirmLabel, cancelLabel = 'Cancel', showQuestion = false, onConfirm, busy = false, disabledReason, describedBy }: ConfirmActionProps) {
  const [confirming, setConfirming] = useState(false);
  const [returnFocus, setReturnFocus] = useState(false);
  // Button takes no ref, so focus is moved through the wrapper around it.
  const wrapper = useRef<HTMLSpanElement>(null);

  useEffect(() => {
    if (confirming) wrapper.current?.querySelector<HTMLButtonElement>('[data-confirm-cancel]')?.focus();
    else if (returnFocus) {
      wrapper.current?.querySelector('button')?.focus();
      setReturnFocus(false);
    }
  }, [confirming, returnFocus]);

  if (!confirming) {
    return (
      <span ref={wrapper} className="inline-flex">
        <Button variant="ghost" aria-label={ariaLabel} disabledReason={disabledReason} aria-describedby={describedBy} onClick={() => setConfirming(true)}>
          {label}
        </Button>
      </span>
    );
  }
  return (
    // The question names the group for screen readers and shows on hover; the row says whom it is about.
    <span ref={wrapper} role="group" aria-label={question} title={question} className="inline-flex flex-wrap items-center justify-end gap-2">
      {showQuestion && <span className="text-xs text-slate-700 dark:text-slate-300">{question}</span>}
      <Button variant="danger" busy={busy} onClick={onConfirm}>
        {confirmLabel}
      </Button>
      <Button
        data-confirm-cancel
        variant="ghost"
        disabled={busy}
        onClick={() => {
          setConfirming(false);
          setReturnFocus(true);
        }}
      >
        {cancelLabel}
      </Button>
    </span>
  );
}
