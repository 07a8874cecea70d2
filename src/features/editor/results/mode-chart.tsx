import { memo, useEffect, useMemo, useRef, useState, type KeyboardEvent } from 'react';
import { t60FromDecayRate } from '../../../../shared/engine/mode-decay';
import type { FieldIssue } from '../../../../shared/patch/field-issue';
import type { ComputeResult } from '../../../lib/live-session/session-connection';
import { BottomAxis, SideAxis, type ChartMargins } from './chart-axes';
import { ChartFrame, resultsState } from './chart-frame';
import { frequencyTickLabel, linearScale, logScale, logTicks } from './chart-scales';
import { MODE_LEVEL_FLOOR_DB, modeLevelsDb } from './mode-level-db';
import { loudestModePerColumn, nearestModeIndex } from './mode-marks';
import { formatCount, formatDb, formatHz, formatT60 } from './quantity-format';
import { MINUS } from './si-prefix';
import { T60Legend } from './t60-legend';
import { t60Colour } from './t60-colour-scale';

export interface ModeChartProps {
  result: ComputeResult | null;
  issues: FieldIssue[];
  /** Called with the mode number n (1 = fundamental) under the pointer or keyboard, null when none. */
  onHoverMode?: (n: number | null) => void;
  /** Fill the parent's height (a workbench pane) instead of the fixed height. */
  fill?: boolean;
}

const HEIGHT_PX = 240;
const MARGINS: ChartMargins = { top: 34, right: 14, bottom: 40, left: 52 };
const LEVEL_TICKS_DB = [0, -20, -40, -60, -80];
/** The pointer inspects the drawn mark nearest to it within this distance. */
const HOVER_REACH_PX = 12;
/** Dots on the stems only while they are sparse enough to be told apart. */
const MAX_MARKS_WITH_DOTS = 200;

/** What the chart draws from one result, worked out once per result. */
interface ModeFigures {
  levelsDb: Float64Array;
  t60S: Array<number | null>;
  colours: string[];
  loudestIndex: number;
  domainHz: [number, number];
}

function modeFigures(result: ComputeResult): ModeFigures {
  const count = result.modeCount;
  const levelsDb = modeLevelsDb(result.energyJ.subarray(0, count));
  const t60S: Array<number | null> = [];
  const colours: string[] = [];
  let loudestIndex = 0;
  let lowestHz = Infinity;
  let highestHz = 0;
  for (let m = 0; m < count; m++) {
    t60S.push(t60FromDecayRate(result.decayRatePerS[m]));
    colours.push(t60Colour(t60S[m]));
    if (result.energyJ[m] > result.energyJ[loudestIndex]) loudestIndex = m;
    lowestHz = Math.min(lowestHz, result.frequencyHz[m]);
    highestHz = Math.max(highestHz, result.frequencyHz[m]);
  }
  // A little room either side of the outermost modes, so their stems don't sit on the frame.
  const domainHz: [number, number] = count > 0 && lowestHz > 0 ? [lowestHz / 1.3, highestHz * 1.3] : [20, 20000];
  return { levelsDb, t60S, colours, loudestIndex, domainHz };
}

/** The words of the tooltip and of the keyboard's value: "Mode 3 · 660.0 Hz · −9.5 dB · T60 2.10 s". */
export function modeDescription(result: ComputeResult, figures: ModeFigures, n: number): string {
  const m = n - 1;
  const level = figures.levelsDb[m] <= MODE_LEVEL_FLOOR_DB ? `≤ ${formatDb(MODE_LEVEL_FLOOR_DB)}` : formatDb(figures.levelsDb[m]);
  return `Mode ${n} · ${formatHz(result.frequencyHz[m])} · ${level} · T60 ${formatT60(figures.t60S[m])}`;
}

function modeSummary(result: ComputeResult, figures: ModeFigures): string {
  const count = result.modeCount;
  if (count === 0) return 'No modes are kept.';
  const finite = figures.t60S.filter((t60S): t60S is number => t60S !== null);
  const lossless = count - finite.length;
  const t60Range =
    finite.length > 0
      ? `T60 from ${formatT60(Math.min(...finite))} to ${formatT60(Math.max(...finite))}${lossless > 0 ? `, ${formatCount(lossless)} with no loss` : ''}.`
      : 'No mode loses energy.';
  return (
    `${formatCount(count)} mode${count === 1 ? '' : 's'} from ${formatHz(result.frequencyHz[0])} to ${formatHz(result.frequencyHz[count - 1])}; ` +
    `the loudest is mode ${figures.loudestIndex + 1}. ${t60Range}`
  );
}

function levelTickLabel(levelDb: number): string {
  return levelDb < 0 ? `${MINUS}${Math.abs(levelDb)}` : String(levelDb);
}

/**
 * The mode table as a chart: one stem per mode at its frequency (log axis), as high as its level
 * relative to the loudest mode (from energy, floor −80 dB) and coloured by its decay time T60.
 * Pointing near a stem, or focusing the chart and stepping with the arrow keys (which reach every
 * mode, drawn or not), shows that mode's figures and reports its number through `onHoverMode`.
 */
export const ModeChart = memo(function ModeChart({ result, issues, onHoverMode, fill = false }: ModeChartProps) {
  const state = resultsState(result, issues);
  const figures = useMemo(() => (result ? modeFigures(result) : null), [result]);
  const [inspectedN, setInspectedN] = useState<number | null>(null);
  const focused = useRef(false);
  const count = result?.modeCount ?? 0;
  const shownN = state === 'ready' && inspectedN !== null && inspectedN >= 1 && inspectedN <= count ? inspectedN : null;

  const report = useRef(onHoverMode);
  useEffect(() => {
    report.current = onHoverMode;
  }, [onHoverMode]);
  const reportedN = useRef<number | null>(null);
  useEffect(() => {
    if (reportedN.current === shownN) return;
    reportedN.current = shownN;
    report.current?.(shownN);
  }, [shownN]);

  const summary = result && figures ? modeSummary(result, figures) : null;

  const onKeyDown = (event: KeyboardEvent<HTMLDivElement>) => {
    if (count === 0) return;
    const current = shownN ?? 1;
    const steps: Record<string, number | null> = {
      ArrowRight: current + 1,
      ArrowUp: current + 1,
      ArrowLeft: current - 1,
      ArrowDown: current - 1,
      PageUp: current + 10,
      PageDown: current - 10,
      Home: 1,
      End: count,
      Escape: null,
    };
    if (!(event.key in steps)) return;
    event.preventDefault();
    const next = steps[event.key];
    setInspectedN(next === null ? null : Math.min(count, Math.max(1, next)));
  };

  return (
    <ChartFrame title="Modes" subject="the mode chart" summary={summary} state={state} heightPx={fill ? undefined : HEIGHT_PX} footer={<T60Legend />}>
      {(widthPx, heightPx) =>
        result && figures ? (
          <div
            role="slider"
            tabIndex={count > 0 ? 0 : -1}
            aria-label="Inspect a mode"
            aria-valuemin={1}
            aria-valuemax={Math.max(1, count)}
            aria-valuenow={shownN ?? 1}
            aria-valuetext={count > 0 ? modeDescription(result, figures, shownN ?? 1) : 'No modes'}
            aria-keyshortcuts="ArrowLeft ArrowRight Home End PageUp PageDown Escape"
            className="h-full w-full rounded-md focus-visible:outline-2 focus-visible:outline-offset-2 focus-visible:outline-teal-400"
            onKeyDown={onKeyDown}
            onFocus={() => {
              focused.current = true;
              if (count > 0) setInspectedN((n) => (n !== null && n <= count ? n : 1));
            }}
            onBlur={() => {
              focused.current = false;
              setInspectedN(null);
            }}
          >
            <ModePlot
              result={result}
              figures={figures}
              widthPx={widthPx}
              heightPx={heightPx}
              shownN={shownN}
              onPointerMode={(n) => {
                if (n !== null || !focused.current) setInspectedN(n);
              }}
            />
          </div>
        ) : null
      }
    </ChartFrame>
  );
});

interface ModePlotProps {
  result: ComputeResult;
  figures: ModeFigures;
  widthPx: number;
  heightPx: number;
  shownN: number | null;
  onPointerMode: (n: number | null) => void;
}

function ModePlot({ result, figures, widthPx, heightPx, shownN, onPointerMode }: ModePlotProps) {
  const count = result.modeCount;
  const plotRight = Math.max(MARGINS.left + 10, widthPx - MARGINS.right);
  const plotBottom = heightPx - MARGINS.bottom;
  const layout = useMemo(() => {
    const x = logScale(figures.domainHz, [MARGINS.left, plotRight]);
    const xPx = new Float64Array(count);
    for (let m = 0; m < count; m++) xPx[m] = x(result.frequencyHz[m]);
    const drawn = loudestModePerColumn(xPx, figures.levelsDb);
    return { x, xPx, drawn, drawnXPx: Float64Array.from(drawn, (m) => xPx[m]) };
  }, [result, figures, count, plotRight]);
  const y = linearScale([MODE_LEVEL_FLOOR_DB, 0], [plotBottom, MARGINS.top]);
  const xTicks = logTicks(figures.domainHz, Math.max(3, Math.floor((plotRight - MARGINS.left) / 45)));
  const withDots = layout.drawn.length <= MAX_MARKS_WITH_DOTS;
  const shownIndex = shownN === null ? null : shownN - 1;

  return (
    <>
      <svg
        width={widthPx}
        height={heightPx}
        viewBox={`0 0 ${widthPx} ${heightPx}`}
        className="block"
        onPointerMove={(event) => {
          const px = event.clientX - event.currentTarget.getBoundingClientRect().left;
          const nearest = nearestModeIndex(layout.drawnXPx, px);
          onPointerMode(nearest >= 0 && Math.abs(layout.drawnXPx[nearest] - px) <= HOVER_REACH_PX ? layout.drawn[nearest] + 1 : null);
        }}
        onPointerLeave={() => onPointerMode(null)}
      >
        <SideAxis scale={y} ticks={LEVEL_TICKS_DB} format={levelTickLabel} title="level (dB re loudest)" at={MARGINS.left} gridTo={plotRight} />
        <BottomAxis scale={layout.x} ticks={xTicks} format={frequencyTickLabel} title="frequency (Hz, log)" at={plotBottom} />
        {layout.drawn.length < count && (
          <text x={plotRight} y={MARGINS.top - 4} textAnchor="end" className="fill-slate-700 text-[10px] dark:fill-slate-300">
            {`${formatCount(layout.drawn.length)} of ${formatCount(count)} drawn: the loudest in each pixel`}
          </text>
        )}
        {count === 0 && (
          <text x={(MARGINS.left + plotRight) / 2} y={(MARGINS.top + plotBottom) / 2} textAnchor="middle" className="fill-slate-700 text-xs dark:fill-slate-300">
            No modes are kept
          </text>
        )}
        {shownIndex !== null && (
          <line
            x1={layout.xPx[shownIndex]}
            x2={layout.xPx[shownIndex]}
            y1={MARGINS.top}
            y2={plotBottom}
            className="stroke-teal-600 dark:stroke-teal-400"
            strokeDasharray="3 3"
            aria-hidden="true"
          />
        )}
        <g aria-hidden="true">
          {layout.drawn.map((m) => {
            const xPx = layout.xPx[m];
            const levelPx = y(figures.levelsDb[m]);
            const colour = figures.colours[m];
            return (
              <g key={m} data-mode={m + 1}>
                <line x1={xPx} x2={xPx} y1={plotBottom} y2={levelPx} stroke={colour} strokeWidth={withDots ? 2 : 1} />
                {withDots && <circle cx={xPx} cy={levelPx} r={3} fill={colour} className="stroke-slate-700 dark:stroke-slate-300" strokeWidth={0.75} />}
              </g>
            );
          })}
        </g>
        {shownIndex !== null && (
          <circle
            cx={layout.xPx[shownIndex]}
            cy={y(figures.levelsDb[shownIndex])}
            r={5.5}
            fill="none"
            className="stroke-teal-600 dark:stroke-teal-400"
            strokeWidth={2}
            aria-hidden="true"
          />
        )}
      </svg>
      {shownIndex !== null && (
        <div
          role="tooltip"
          className="pointer-events-none absolute top-0 -translate-x-1/2 whitespace-nowrap rounded-md border border-slate-300 bg-white px-2 py-1 text-xs text-slate-900 shadow-sm dark:border-slate-700 dark:bg-slate-800 dark:text-slate-100"
          style={{ left: Math.min(widthPx - 130, Math.max(130, layout.xPx[shownIndex])) }}
        >
          {modeDescription(result, figures, shownIndex + 1)}
        </div>
      )}
    </>
  );
}
