import type { PresetSummary } from '../../../../shared/api/responses';
import { ACTION_REASONS } from '../../../../shared/access/roles';
import { Button } from '../../../components/button';
import { DataTable, type Column } from '../../../components/data-table';
import { AuditionButton } from '../../../components/audition-button';

export type PresetAction = 'details' | 'load' | 'tags' | 'delete';

export interface PresetsTableProps {
  presets: PresetSummary[];
  /** Leads: edit tags and delete. */
  canManage: boolean;
  /** Leads and designers: load a preset into a session. */
  canLoad: boolean;
  onAction: (action: PresetAction, preset: PresetSummary) => void;
}

const day = new Intl.DateTimeFormat(undefined, { dateStyle: 'medium' });
const dateTime = new Intl.DateTimeFormat(undefined, { dateStyle: 'medium', timeStyle: 'short' });

const linkButton =
  'inline-flex items-center justify-center rounded-md border border-slate-700/30 bg-white px-4 py-2 text-sm font-semibold text-slate-900 hover:bg-white focus-visible:outline-2 focus-visible:outline-offset-2 focus-visible:outline-teal-400 dark:border-slate-300/20 dark:bg-slate-800 dark:text-slate-100 dark:hover:bg-slate-700';

/** The words a screen reader adds after a button's visible label, so each row's buttons are told apart. */
const forPreset = (text: string) => <span className="sr-only"> {text}</span>;

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

/**
 * The studio's presets in the order the server sent them (the page's sort); the headers re-sort
 * the rows shown. Every action is a button or link in the row, reachable with Tab.
 */
export function PresetsTable({ presets, canManage, canLoad, onAction }: PresetsTableProps) {
  const manageReason = canManage ? undefined : ACTION_REASONS.managePresets;
  const loadReason = canLoad ? undefined : ACTION_REASONS.editSessions;

  const columns: Column<PresetSummary>[] = [
    {
      key: 'name',
      header: 'Preset',
      sortValue: (preset) => preset.name.toLowerCase(),
      render: (preset) => (
        <div className="min-w-40 max-w-64">
          <p className="line-clamp-2 break-words font-semibold text-slate-900 dark:text-slate-100" title={preset.name}>
            {preset.name}
          </p>
          {preset.description && (
            <p className="line-clamp-1 max-w-xs text-xs text-slate-600 dark:text-slate-300" title={preset.description}>
              {preset.description}
            </p>
          )}
        </div>
      ),
    },
    { key: 'tags', header: 'Tags', render: (preset) => <TagChips tags={preset.tags} /> },
    { key: 'version', header: 'Version', sortValue: (preset) => preset.version, className: 'tabular-nums', render: (preset) => `v${preset.version}` },
    { key: 'author', header: 'Author', sortValue: (preset) => preset.author?.displayName?.toLowerCase() ?? '', render: (preset) => preset.author?.displayName ?? '—' },
    {
      key: 'updatedAt',
      header: 'Last updated',
      sortValue: (preset) => Date.parse(preset.updatedAt),
      className: 'whitespace-nowrap',
      render: (preset) => (
        <time dateTime={preset.updatedAt} title={dateTime.format(new Date(preset.updatedAt))}>
          {day.format(new Date(preset.updatedAt))}
        </time>
      ),
    },
    {
      key: 'actions',
      header: 'Actions',
      className: 'text-right',
      render: (preset) => (
        // Two lines: inspecting and using the preset, then looking after the library (leads).
        <div className="flex min-w-[28rem] flex-col items-end gap-2">
          <div className="flex flex-wrap justify-end gap-2">
            <AuditionButton url={`/api/presets/${preset.id}/preview.wav`} label={preset.name} />
            <Button variant="secondary" onClick={() => onAction('details', preset)}>
              Details{forPreset(`of ${preset.name}`)}
            </Button>
            <a href={`/api/presets/${preset.id}/download`} download className={linkButton}>
              Download{forPreset(preset.name)}
            </a>
            <Button variant="secondary" disabledReason={loadReason} onClick={() => onAction('load', preset)}>
              Load into session…{forPreset(`(${preset.name})`)}
            </Button>
          </div>
          <div className="flex flex-wrap justify-end gap-2">
            <Button variant="secondary" disabledReason={manageReason} onClick={() => onAction('tags', preset)}>
              Edit tags{forPreset(`of ${preset.name}`)}
            </Button>
            <Button variant="ghost" disabledReason={manageReason} onClick={() => onAction('delete', preset)}>
              Delete{forPreset(preset.name)}
            </Button>
          </div>
        </div>
      ),
    },
  ];

  return <DataTable caption="Presets of this studio" rows={presets} columns={columns} rowKey={(preset) => preset.id} />;
}
