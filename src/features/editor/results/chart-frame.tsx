import { useId, type ReactNode } from 'react';
import type { ComputeResult } from '../../../lib/live-session/session-connection';
import type { FieldIssue } from '../../../../shared/patch/field-issue';
import { useElementSize } from '../../../components/use-element-size';

export type ResultsState = 'problems' | 'waiting' | 'ready';

/** What a results chart shows: problems with the patch come first, then "no result yet". */
export function resultsState(result: ComputeResult | null, issues: readonly FieldIssue[]): ResultsState {
  if (issues.length > 0) return 'problems';
  return result ? 'ready' : 'waiting';
}

export interface ChartFrameProps {
  title: string;
  /** What the chart shows, in words: read with the figure and shown under its title. */
  summary: string | null;
  /** What the chart is of, for its state messages ("the spectrum"). */
  subject: string;
  state: ResultsState;
  /** The plot's height; without it the frame fills its parent's height and the plot takes what is left. */
  heightPx?: number;
  /** Draws the chart at the measured width and plot height, only in the ready state. */
  children: (widthPx: number, heightPx: number) => ReactNode;
  /** Drawn under the plot, e.g. a colour legend (hidden, keeping its space, until there is a result). */
  footer?: ReactNode;
}

/**
 * The frame of one results chart: a figure with its title and summary as caption, a plot area
 * of fixed height (so a change of state never moves the page) sized to the container's width,
 * and the "no result yet" and "patch has problems" states. Without a height it fills its pane
 * (the workbench's resizable panes), and the plot follows the pane.
 */
export function ChartFrame({ title, summary, subject, state, heightPx, children, footer }: ChartFrameProps) {
  const titleId = useId();
  const summaryId = useId();
  const fill = heightPx === undefined;
  const [plotRef, plotSize] = useElementSize<HTMLDivElement>({ widthPx: 640, heightPx: heightPx ?? MIN_FILL_PLOT_PX });
  const plotHeightPx = fill ? Math.max(MIN_FILL_PLOT_PX, plotSize.heightPx) : heightPx;
  return (
    <figure
      aria-labelledby={titleId}
      aria-describedby={summary && state === 'ready' ? summaryId : undefined}
      className={`m-0 min-w-0 rounded-lg border border-slate-300 bg-white p-3 dark:border-slate-700 dark:bg-slate-900 ${fill ? 'flex h-full min-h-0 flex-col' : ''}`}
    >
      <figcaption className="mb-2 shrink-0">
        <h3 id={titleId} className="text-sm font-semibold text-slate-900 dark:text-slate-100">
          {title}
        </h3>
        <p id={summaryId} className={`text-xs text-slate-700 dark:text-slate-300 ${fill ? 'line-clamp-2 min-h-8' : 'min-h-8'}`} title={fill && state === 'ready' && summary ? summary : undefined}>
          {state === 'ready' ? summary : ''}
        </p>
      </figcaption>
      <div ref={plotRef} className={`relative w-full ${fill ? 'min-h-0 flex-1 overflow-hidden' : ''}`} style={fill ? { minHeight: MIN_FILL_PLOT_PX } : { height: heightPx }}>
        {state === 'ready' ? (
          children(plotSize.widthPx, plotHeightPx)
        ) : (
          <div className="flex h-full flex-col items-center justify-center rounded-md border border-dashed border-slate-300 px-4 text-center dark:border-slate-700">
            <p className="text-sm font-semibold text-slate-900 dark:text-slate-100">{state === 'problems' ? 'The patch has problems' : 'No result yet'}</p>
            <p className="mt-1 text-xs text-slate-700 dark:text-slate-300">
              {state === 'problems' ? `${capitalise(subject)} returns once they are fixed.` : `${capitalise(subject)} appears when the first result arrives.`}
            </p>
          </div>
        )}
      </div>
      {/* The footer keeps its space in every state, so the page does not move when a result comes or goes. */}
      {footer && (
        <div className={`shrink-0 ${state === 'ready' ? '' : 'invisible'}`} aria-hidden={state === 'ready' ? undefined : true}>
          {footer}
        </div>
      )}
    </figure>
  );
}

/** A plot that fills its pane is never drawn shorter than this; the pane scrolls instead. */
const MIN_FILL_PLOT_PX = 110;

function capitalise(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1);
}
