import { useMemo, useState, type KeyboardEvent, type MouseEvent } from 'react';
import type { PresetSummary } from '../../../../shared/api/responses';
import { AuditionButton } from '../../../components/audition-button';
import { Button } from '../../../components/button';

export interface PresetsTableProps {
  presets: PresetSummary[];
  /** The preset whose details are open beside the table, if any. */
  selectedId: string | null;
  /** The id of the details panel the rows control. */
  detailsId: string;
  /** Opens a preset's details; `focusDetails` moves focus into them (the Details button does, a row does not). */
  onSelect: (preset: PresetSummary, focusDetails: boolean) => void;
}

/** The words a screen reader adds after a button's visible label, so each row's buttons are told apart. */
export const forPreset = (text: string) => <span className="sr-only"> {text}</span>;

export function TagChips({ tags }: { tags: string[] }) {
  if (tags.length === 0) return <span className="text-slate-600 dark:text-slate-300">—</span>;
  return (
    <ul aria-label="Tags" className="flex flex-wrap gap-1">
      {tags.map((tag) => (
        <li key={tag} className="rounded-full border border-teal-600/50 bg-teal-400/15 px-2 py-0.5 text-xs font-semibold text-slate-900 dark:border-teal-400/40 dark:text-slate-100">
          {tag}
        </li>
      ))}
    </ul>
  );
}

type SortKey = 'name' | 'version';
const SORT_VALUES: Record<SortKey, (preset: PresetSummary) => string | number> = {
  name: (preset) => preset.name.toLowerCase(),
  version: (preset) => preset.version,
};

/** A click on a control inside the row is that control's, not a selection of the row. */
const fromControl = (event: MouseEvent | KeyboardEvent) => event.target instanceof Element && event.target.closest('button, a, input, select, textarea') !== null;

/**
 * The studio's presets, one compact row each, in the order the server sent them (the page's sort);
 * the Preset and Version headers re-sort the rows shown. A row is selected by a click or by Enter or
 * Space while it has focus; its details and the actions that look after the library open beside the
 * table. The row itself keeps only audition and Details.
 */
export function PresetsTable({ presets, selectedId, detailsId, onSelect }: PresetsTableProps) {
  const [sort, setSort] = useState<{ key: SortKey; direction: 'ascending' | 'descending' } | null>(null);
  const rows = useMemo(() => {
    if (!sort) return presets;
    const value = SORT_VALUES[sort.key];
    const factor = sort.direction === 'ascending' ? 1 : -1;
    return [...presets].sort((a, b) => {
      const [x, y] = [value(a), value(b)];
      return (typeof x === 'number' && typeof y === 'number' ? x - y : String(x).localeCompare(String(y))) * factor;
    });
  }, [presets, sort]);

  const header = (key: SortKey, label: string, className = '') => {
    const active = sort?.key === key;
    return (
      <th scope="col" aria-sort={active ? sort.direction : undefined} className={`px-3 py-2 font-semibold ${className}`}>
        <button
          type="button"
          className="inline-flex items-center gap-1 rounded focus-visible:outline-2 focus-visible:outline-teal-400"
          onClick={() => setSort({ key, direction: active && sort.direction === 'ascending' ? 'descending' : 'ascending' })}
        >
          {label}
          <span aria-hidden="true" className="w-3 text-xs">
            {active ? (sort.direction === 'ascending' ? '▲' : '▼') : ''}
          </span>
        </button>
      </th>
    );
  };

  return (
    <div className="rounded-lg border border-slate-700/20 dark:border-slate-300/15">
      <table className="w-full table-fixed border-collapse text-left text-sm">
        <caption className="sr-only">Presets of this studio</caption>
        <colgroup>
          <col />
          <col className="w-[38%]" />
          <col className="w-20" />
          <col className="w-48" />
        </colgroup>
        <thead className="bg-slate-700/5 dark:bg-slate-100/5">
          <tr>
            {header('name', 'Preset')}
            <th scope="col" className="px-3 py-2 font-semibold">
              Tags
            </th>
            {header('version', 'Version')}
            <th scope="col" className="px-3 py-2 text-right font-semibold">
              Actions
            </th>
          </tr>
        </thead>
        <tbody>
          {rows.map((preset) => {
            const selected = preset.id === selectedId;
            return (
              <tr
                key={preset.id}
                tabIndex={0}
                aria-selected={selected}
                aria-controls={detailsId}
                onClick={(event) => {
                  if (!fromControl(event)) onSelect(preset, false);
                }}
                onKeyDown={(event) => {
                  if (event.target !== event.currentTarget || (event.key !== 'Enter' && event.key !== ' ')) return;
                  event.preventDefault();
                  onSelect(preset, false);
                }}
                className={`cursor-pointer border-t border-slate-700/10 outline-none focus-visible:outline-2 focus-visible:-outline-offset-2 focus-visible:outline-teal-400 dark:border-slate-300/10 ${
                  selected ? 'bg-brass-400/15 dark:bg-brass-400/10' : 'hover:bg-brass-400/5'
                }`}
              >
                <td className={`border-l-[3px] px-3 py-1.5 align-middle ${selected ? 'border-l-brass-500' : 'border-l-transparent'}`}>
                  <p className="truncate font-semibold text-slate-900 dark:text-slate-100" title={preset.name}>
                    {preset.name}
                  </p>
                </td>
                <td className="px-3 py-1.5 align-middle">
                  <TagChips tags={preset.tags} />
                </td>
                <td className="px-3 py-1.5 align-middle tabular-nums">v{preset.version}</td>
                <td className="px-3 py-1.5 align-middle">
                  <div className="flex flex-wrap items-start justify-end gap-2">
                    <AuditionButton url={`/api/presets/${preset.id}/preview.wav`} label={preset.name} />
                    <Button variant="secondary" aria-expanded={selected} aria-controls={detailsId} onClick={() => onSelect(preset, true)}>
                      Details{forPreset(`of ${preset.name}`)}
                    </Button>
                  </div>
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}
