import type { RenderView } from '../../../../shared/renders/render-settings';

const STATE_WORDS: Record<RenderView['state'], string> = { queued: 'Queued', rendering: 'Rendering', done: 'Done', failed: 'Failed', cancelled: 'Cancelled' };

/**
 * A job's state: a progress bar while it waits or runs (its value read out by screen readers),
 * the reason when it failed.
 */
export function RenderState({ render }: { render: Pick<RenderView, 'name' | 'state' | 'progressPercent' | 'error'> }) {
  const { state, progressPercent } = render;
  if (state === 'queued' || state === 'rendering') {
    const percent = state === 'queued' ? 0 : Math.round(progressPercent);
    return (
      <div className="flex min-w-32 flex-col gap-1">
        <span className="text-sm font-semibold">
          {STATE_WORDS[state]}
          {state === 'rendering' && <span className="tabular-nums"> {percent} %</span>}
        </span>
        <div
          role="progressbar"
          aria-label={`Progress of ${render.name}`}
          aria-valuemin={0}
          aria-valuemax={100}
          aria-valuenow={percent}
          aria-valuetext={state === 'queued' ? 'Queued' : `${percent} %`}
          className="h-2 w-full overflow-hidden rounded-full bg-slate-300 dark:bg-slate-700"
        >
          <div className="h-full rounded-full bg-teal-600 transition-[width] duration-300 dark:bg-teal-400" style={{ width: `${percent}%` }} />
        </div>
      </div>
    );
  }
  if (state === 'failed') {
    return (
      <div className="max-w-56">
        <span className="text-sm font-semibold text-ember-600 dark:text-ember-400">{STATE_WORDS.failed}</span>
        {render.error && <p className="text-xs text-ember-700 dark:text-ember-300">{render.error}</p>}
      </div>
    );
  }
  return <span className={`text-sm font-semibold ${state === 'done' ? 'text-teal-600 dark:text-teal-400' : 'text-slate-700 dark:text-slate-300'}`}>{STATE_WORDS[state]}</span>;
}
