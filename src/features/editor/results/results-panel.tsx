import { memo } from 'react';
import { Notice } from '../../../components/notice';
import type { FieldIssue } from '../../../../shared/patch/field-issue';
import type { ComputeResult } from '../../../lib/live-session/session-connection';
import type { PreviewSound } from '../../../lib/synthesis/preview-sound';
import { resultsState } from './chart-frame';
import { ModeChart } from './mode-chart';
import { resultFigures } from './result-figures';
import { Spectrum } from './spectrum';
import { useSettledValue } from './use-settled-value';
import { Waveform } from './waveform';

export interface ResultsPanelProps {
  result: ComputeResult | null;
  /** The preview synthesised from the result, for the spectrum and waveform. */
  sound?: PreviewSound | null;
  issues: FieldIssue[];
  /** Called with the mode number under the pointer or keyboard in the mode chart, null when none. */
  onHoverMode?: (n: number | null) => void;
}

/** At most this many problems are listed; the rest are counted. */
const LISTED_ISSUES = 5;

/**
 * The results of the live session: a line of headline figures (f0, modes kept, total energy, T60 of
 * mode 1), the mode chart across the top, and the spectrum and waveform of the preview side by side
 * (those two redraw when results settle, at least once a second while they stream). Memoised: a
 * teammate's drag changes the patch many times a second, and none of that redraws the charts.
 */
export const ResultsPanel = memo(function ResultsPanel({ result, sound = null, issues, onHoverMode }: ResultsPanelProps) {
  const state = resultsState(result, issues);
  // The mode chart follows every result; the spectrum and waveform redraw once results settle.
  const settledResult = useSettledValue(result);
  const settledSound = useSettledValue(sound);
  return (
    <section aria-label="Results" className="flex flex-col gap-3">
      {state === 'problems' ? (
        <Notice tone="caution" title="The patch has problems">
          <ul className="list-disc pl-5">
            {issues.slice(0, LISTED_ISSUES).map((issue) => (
              <li key={`${issue.field}:${issue.problem}`}>{issue.message}</li>
            ))}
          </ul>
          {issues.length > LISTED_ISSUES && <p className="mt-1">…and {issues.length - LISTED_ISSUES} more.</p>}
        </Notice>
      ) : (
        <FiguresLine result={result} />
      )}
      <ModeChart result={result} issues={issues} onHoverMode={onHoverMode} />
      <div className="grid gap-3 md:grid-cols-2">
        <Spectrum result={settledResult} sound={settledSound} issues={issues} />
        <Waveform result={settledResult} sound={settledSound} issues={issues} />
      </div>
    </section>
  );
});

/**
 * The workbench's results pane: the headline figures (or the problems) over the mode chart, which
 * fills the rest of the pane and follows every result. The spectrum and waveform live in the
 * workbench's tabs instead.
 */
export const ModesPane = memo(function ModesPane({ result, issues, onHoverMode }: ResultsPanelProps) {
  const state = resultsState(result, issues);
  return (
    <section aria-label="Results" className="flex h-full min-h-0 flex-col gap-2">
      {state === 'problems' ? (
        <Notice tone="caution" title="The patch has problems">
          <ul className="max-h-24 list-disc overflow-auto pl-5">
            {issues.slice(0, LISTED_ISSUES).map((issue) => (
              <li key={`${issue.field}:${issue.problem}`}>{issue.message}</li>
            ))}
          </ul>
          {issues.length > LISTED_ISSUES && <p className="mt-1">…and {issues.length - LISTED_ISSUES} more.</p>}
        </Notice>
      ) : (
        <FiguresLine result={result} />
      )}
      <div className="min-h-0 flex-1">
        <ModeChart result={result} issues={issues} onHoverMode={onHoverMode} fill />
      </div>
    </section>
  );
});

function FiguresLine({ result }: { result: ComputeResult | null }) {
  if (!result) {
    return (
      <p role="status" className="min-h-6 text-sm text-slate-700 dark:text-slate-300">
        No result yet: the figures appear when the server sends the first one.
      </p>
    );
  }
  const figures = resultFigures(result);
  const items: Array<[label: string, value: string]> = [
    ['f0', figures.f0],
    ['Modes kept', figures.modesKept],
    ['Total energy', figures.totalEnergy],
    ['T60 of mode 1', figures.firstModeT60],
  ];
  return (
    <div role="group" aria-label="Result figures">
      <dl className="flex min-h-6 flex-wrap items-baseline gap-x-5 gap-y-1 text-sm">
        {items.map(([label, value]) => (
          <div key={label} className="flex items-baseline gap-1.5">
            <dt className="text-slate-700 dark:text-slate-300">{label}</dt>
            <dd className="font-semibold tabular-nums text-slate-900 dark:text-slate-100">{value}</dd>
          </div>
        ))}
      </dl>
    </div>
  );
}
