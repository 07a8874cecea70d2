import type { Scale } from './chart-scales';

/** Inner margins of every results chart, in pixels, leaving room for tick labels and axis titles. */
export interface ChartMargins {
  top: number;
  right: number;
  bottom: number;
  left: number;
}

const TICK_PX = 4;
const tickText = 'fill-slate-700 text-[10px] dark:fill-slate-300';
const titleText = 'fill-slate-800 text-[11px] font-semibold dark:fill-slate-100';
const axisLine = 'stroke-slate-700 dark:stroke-slate-300';
const gridLine = 'stroke-slate-300 dark:stroke-slate-700';

export interface AxisProps {
  scale: Scale;
  ticks: number[];
  format: (value: number) => string;
  /** The axis title, with its unit, e.g. "frequency (Hz)". */
  title: string;
  /** Where the axis line sits across the plot: y of a bottom axis, x of a side axis. */
  at: number;
  /** Gridlines across the plot to this coordinate (the opposite edge), when given. */
  gridTo?: number;
  /** For a side axis: which side its labels go. */
  side?: 'left' | 'right';
  /** A tint for a second axis drawn in its curve's colour. */
  className?: string;
}

/** A horizontal axis under a plot: line, ticks, labels and a centred title. */
export function BottomAxis({ scale, ticks, format, title, at, gridTo }: AxisProps) {
  const [from, to] = scale.range;
  return (
    <g aria-hidden="true">
      {gridTo !== undefined &&
        ticks.map((tick) => <line key={`grid-${tick}`} x1={scale(tick)} x2={scale(tick)} y1={at} y2={gridTo} className={gridLine} strokeWidth={0.5} />)}
      <line x1={from} x2={to} y1={at} y2={at} className={axisLine} strokeWidth={1} />
      {ticks.map((tick) => (
        <g key={tick} transform={`translate(${scale(tick)},${at})`}>
          <line y2={TICK_PX} className={axisLine} />
          <text y={TICK_PX + 10} textAnchor="middle" className={tickText}>
            {format(tick)}
          </text>
        </g>
      ))}
      <text x={(from + to) / 2} y={at + 30} textAnchor="middle" className={titleText}>
        {title}
      </text>
    </g>
  );
}

/** A vertical axis at the left or right of a plot, its title turned to run along it. */
export function SideAxis({ scale, ticks, format, title, at, gridTo, side = 'left', className }: AxisProps) {
  const [from, to] = scale.range;
  const outward = side === 'left' ? -1 : 1;
  return (
    <g aria-hidden="true" className={className}>
      {gridTo !== undefined &&
        ticks.map((tick) => <line key={`grid-${tick}`} y1={scale(tick)} y2={scale(tick)} x1={at} x2={gridTo} className={gridLine} strokeWidth={0.5} />)}
      <line x1={at} x2={at} y1={from} y2={to} className={className ? 'stroke-current' : axisLine} strokeWidth={1} />
      {ticks.map((tick) => (
        <g key={tick} transform={`translate(${at},${scale(tick)})`}>
          <line x2={outward * TICK_PX} className={className ? 'stroke-current' : axisLine} />
          <text x={outward * (TICK_PX + 2)} dy="0.32em" textAnchor={side === 'left' ? 'end' : 'start'} className={className ? 'fill-current text-[10px]' : tickText}>
            {format(tick)}
          </text>
        </g>
      ))}
      <text
        transform={`translate(${at + outward * 34},${(from + to) / 2}) rotate(${side === 'left' ? -90 : 90})`}
        textAnchor="middle"
        className={className ? 'fill-current text-[11px] font-semibold' : titleText}
      >
        {title}
      </text>
    </g>
  );
}
