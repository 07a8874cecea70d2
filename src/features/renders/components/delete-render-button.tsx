import { useEffect, useRef, useState } from 'react';
import { Button } from '../../../components/button';

export interface DeleteRenderButtonProps {
  renderName: string;
  onConfirm: () => void;
  busy?: boolean;
  disabledReason?: string;
}

/**
 * Deleting a render in two steps: "Delete" becomes a question with "Delete file" and "Keep it".
 * Focus goes to "Keep it" when the question appears, and back to "Delete" when it is withdrawn.
 */
export function DeleteRenderButton({ renderName, onConfirm, busy = false, disabledReason }: DeleteRenderButtonProps) {
  const [asking, setAsking] = useState(false);
  const [returnFocus, setReturnFocus] = useState(false);
  const wrapper = useRef<HTMLSpanElement>(null);

  useEffect(() => {
    if (asking) wrapper.current?.querySelector<HTMLButtonElement>('[data-keep]')?.focus();
    else if (returnFocus) {
      wrapper.current?.querySelector('button')?.focus();
      setReturnFocus(false);
    }
  }, [asking, returnFocus]);

  if (!asking) {
    return (
      <span ref={wrapper} className="inline-flex">
        <Button variant="ghost" disabledReason={disabledReason} onClick={() => setAsking(true)}>
          Delete<span className="sr-only"> {renderName}</span>
        </Button>
      </span>
    );
  }
  const question = `Delete “${renderName}” and its file for everyone?`;
  return (
    <span ref={wrapper} role="group" aria-label={question} className="inline-flex flex-wrap items-center justify-end gap-2">
      <span className="text-xs text-slate-700 dark:text-slate-300">{question}</span>
      <Button variant="danger" busy={busy} onClick={onConfirm}>
        Delete file
      </Button>
      <Button
        data-keep
        variant="ghost"
        disabled={busy}
        onClick={() => {
          setAsking(false);
          setReturnFocus(true);
        }}
      >
        Keep it
      </Button>
    </span>
  );
}
