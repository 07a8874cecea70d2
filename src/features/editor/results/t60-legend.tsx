import { rampColourAt, t60ScalePosition, T60_SCALE_MAX_S, T60_SCALE_MIN_S } from './t60-colour-scale';
import { formatT60 } from './quantity-format';

const LEGEND_STOPS = 24;
const LEGEND_TICKS: ReadonlyArray<[t60S: number, label: string]> = [
  [0.01, '10 ms'],
  [0.1, '100 ms'],
  [1, '1 s'],
  [10, '10 s'],
];

/** The key to the mode chart's colours: the decay-time ramp with its times marked. */
export function T60Legend() {
  const gradient = Array.from({ length: LEGEND_STOPS }, (_, stop) => {
    const position = stop / (LEGEND_STOPS - 1);
    return `${rampColourAt(position)} ${(position * 100).toFixed(1)}%`;
  }).join(', ');
  return (
    <div className="mt-2 flex flex-wrap items-center gap-x-4 gap-y-1 text-[11px] text-slate-700 dark:text-slate-300">
      <span className="font-semibold text-slate-800 dark:text-slate-100">Colour: decay time T60</span>
      <div
        className="relative mx-3 w-44 max-w-full pb-4"
        role="img"
        aria-label={`Colour scale of decay time, dark for ${formatT60(T60_SCALE_MIN_S)} or less, light for ${formatT60(T60_SCALE_MAX_S)} or more and for modes with no loss`}
      >
        <div className="h-2.5 rounded-sm border border-slate-300 dark:border-slate-700" style={{ background: `linear-gradient(to right, ${gradient})` }} />
        {LEGEND_TICKS.map(([t60S, label]) => (
          <span
            key={t60S}
            aria-hidden="true"
            className="absolute top-3 -translate-x-1/2 whitespace-nowrap text-[10px]"
            style={{ left: `${t60ScalePosition(t60S) * 100}%` }}
          >
            {label}
          </span>
        ))}
      </div>
      <span aria-hidden="true" className="text-[10px]">
        shorter is darker; 30 s or more, or no loss, lightest
      </span>
    </div>
  );
}
