import { useRef, useState, type KeyboardEvent, type PointerEvent, type ReactNode } from 'react';
import { clampFraction, storedPaneFraction, storePaneFraction } from './pane-layout-store';

export interface SplitPaneProps {
  /** Names the splitter in this device's storage: the share is remembered per id. */
  id: string;
  /** 'row': the panes side by side, the divider upright; 'column': one above the other. */
  direction: 'row' | 'column';
  /** The first pane's share of the space when nothing is remembered (0–1). */
  defaultFraction: number;
  minFraction?: number;
  maxFraction?: number;
  /** What the divider resizes, for assistive technology ("Resize the canvas and the charts"). */
  label: string;
  first: ReactNode;
  second: ReactNode;
  className?: string;
}

/** One arrow-key press moves the divider by this share; Shift moves it five times as far. */
const KEY_STEP = 0.02;
const DIVIDER_PX = 8;

/**
 * Two panes and a divider between them that the pointer drags and the keyboard moves (arrow keys,
 * Home and End; a double click restores the default). The share is remembered on this device.
 * Each pane clips its overflow, so a pane that is too small scrolls inside, never the page.
 */
export function SplitPane({ id, direction, defaultFraction, minFraction = 0.2, maxFraction = 0.8, label, first, second, className = '' }: SplitPaneProps) {
  const [fraction, setFraction] = useState(() => storedPaneFraction(id, minFraction, maxFraction) ?? defaultFraction);
  const boxRef = useRef<HTMLDivElement | null>(null);
  const dragging = useRef(false);
  const row = direction === 'row';

  const settle = (next: number) => {
    const kept = clampFraction(next, minFraction, maxFraction);
    setFraction(kept);
    storePaneFraction(id, kept);
  };
  const fromPointer = (event: PointerEvent) => {
    const box = boxRef.current?.getBoundingClientRect();
    if (!box) return null;
    return row ? (event.clientX - box.left) / box.width : (event.clientY - box.top) / box.height;
  };
  const onPointerDown = (event: PointerEvent<HTMLDivElement>) => {
    dragging.current = true;
    event.currentTarget.setPointerCapture(event.pointerId);
    event.preventDefault();
  };
  const onPointerMove = (event: PointerEvent) => {
    if (!dragging.current) return;
    const next = fromPointer(event);
    if (next !== null) setFraction(clampFraction(next, minFraction, maxFraction));
  };
  const onPointerUp = (event: PointerEvent) => {
    if (!dragging.current) return;
    dragging.current = false;
    const next = fromPointer(event);
    settle(next ?? fraction);
  };
  const onKeyDown = (event: KeyboardEvent) => {
    const step = event.shiftKey ? KEY_STEP * 5 : KEY_STEP;
    const moves: Record<string, number | undefined> = row
      ? { ArrowLeft: fraction - step, ArrowRight: fraction + step, Home: minFraction, End: maxFraction }
      : { ArrowUp: fraction - step, ArrowDown: fraction + step, Home: minFraction, End: maxFraction };
    const next = moves[event.key];
    if (next === undefined) return;
    event.preventDefault();
    settle(next);
  };

  return (
    <div ref={boxRef} className={`flex min-h-0 min-w-0 ${row ? 'flex-row' : 'flex-col'} ${className}`} data-split-pane={id}>
      <div className="flex min-h-0 min-w-0 flex-col overflow-hidden" style={{ flex: `0 0 calc(${(fraction * 100).toFixed(2)}% - ${DIVIDER_PX / 2}px)` }}>
        {first}
      </div>
      <div
        role="separator"
        tabIndex={0}
        aria-label={label}
        aria-orientation={row ? 'vertical' : 'horizontal'}
        aria-valuemin={Math.round(minFraction * 100)}
        aria-valuemax={Math.round(maxFraction * 100)}
        aria-valuenow={Math.round(fraction * 100)}
        title={`${label}: drag, or use the arrow keys; double-click restores the default`}
        onPointerDown={onPointerDown}
        onPointerMove={onPointerMove}
        onPointerUp={onPointerUp}
        onPointerCancel={onPointerUp}
        onKeyDown={onKeyDown}
        onDoubleClick={() => settle(defaultFraction)}
        className={`group flex shrink-0 touch-none items-center justify-center focus-visible:outline-2 focus-visible:outline-teal-400 ${row ? 'cursor-col-resize' : 'cursor-row-resize'}`}
        style={row ? { width: DIVIDER_PX } : { height: DIVIDER_PX }}
      >
        <span className={`rounded-full bg-slate-400/50 group-hover:bg-teal-500 group-focus-visible:bg-teal-500 dark:bg-slate-500/60 ${row ? 'h-10 w-1' : 'h-1 w-10'}`} aria-hidden="true" />
      </div>
      <div className="flex min-h-0 min-w-0 flex-1 flex-col overflow-hidden">{second}</div>
    </div>
  );
}
