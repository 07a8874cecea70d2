import { useEffect, useId, useRef, useState } from 'react';
import { useParams } from 'react-router-dom';
import type { PresetSummary } from '../../../shared/api/responses';
import { can } from '../../../shared/access/roles';
import { EmptyState } from '../../components/empty-state';
import { LoadingBlock } from '../../components/loading-block';
import { Notice } from '../../components/notice';
import { PageHeader } from '../../components/page-header';
import { useMe } from '../../lib/queries/get-me';
import { usePresets, type PresetSort } from '../../features/presets/api/get-presets';
import { DeletePresetPanel } from '../../features/presets/components/delete-preset-panel';
import { EditTagsPanel } from '../../features/presets/components/edit-tags-panel';
import { LoadIntoSessionPanel } from '../../features/presets/components/load-into-session-panel';
import { PresetDetailsPanel } from '../../features/presets/components/preset-details-panel';
import { PresetUploadForm } from '../../features/presets/components/preset-upload-form';
import { PresetsTable, type PresetAction } from '../../features/presets/components/presets-table';
import { tagsInUse } from '../../features/presets/tags';
import { useDebouncedValue } from '../../features/presets/use-debounced-value';
import NotFoundPage from './not-found-page';

const SORT_LABELS: Record<PresetSort, string> = { name: 'Name (A–Z)', date: 'Last updated (newest first)', author: 'Author (A–Z)' };
const SEARCH_DELAY_MS = 250;
const LOADING_ROWS = 6;

const controlClass =
  'rounded-md border border-slate-700/30 bg-white px-3 py-2 font-normal text-slate-900 focus-visible:outline-2 focus-visible:outline-teal-400 dark:border-slate-300/20 dark:bg-slate-900 dark:text-slate-100';

/** The studio's preset library: find, inspect, download and load presets; leads also upload, retag and delete. */
export default function PresetsPage() {
  const { studioId = '' } = useParams();
  const me = useMe();
  const studio = me.data?.studios.find((candidate) => candidate.id === studioId);
  const [search, setSearch] = useState('');
  const [tag, setTag] = useState('');
  const [sort, setSort] = useState<PresetSort>('name');
  const q = useDebouncedValue(search, SEARCH_DELAY_MS);
  const filtered = q.trim() !== '' || tag !== '';
  const presets = usePresets(studioId, { q, tag, sort });
  // The tag menu offers every tag of the studio, not only those of the rows a filter left.
  const allPresets = usePresets(studioId);
  const [panel, setPanel] = useState<{ action: PresetAction; preset: PresetSummary } | null>(null);
  const [flash, setFlash] = useState<string | null>(null);
  const returnFocus = useRef<HTMLElement | null>(null);
  const ids = useId();

  // When a panel closes, focus goes back to the button that opened it (if its row is still there).
  useEffect(() => {
    if (panel || !returnFocus.current) return;
    if (returnFocus.current.isConnected) returnFocus.current.focus();
    returnFocus.current = null;
  }, [panel]);

  if (me.isPending) return <LoadingBlock label="Loading the studio…" rows={LOADING_ROWS} />;
  if (!studio) return <NotFoundPage />;
  const canManage = can(studio.role, 'managePresets');
  const canLoad = can(studio.role, 'editSessions');
  const tagOptions = tagsInUse(allPresets.data ?? []);
  if (tag && !tagOptions.includes(tag)) tagOptions.push(tag);

  const openPanel = (action: PresetAction, preset: PresetSummary) => {
    returnFocus.current = document.activeElement instanceof HTMLElement ? document.activeElement : null;
    setFlash(null);
    setPanel({ action, preset });
  };
  const closePanel = () => setPanel(null);
  const finish = (message: string) => {
    setFlash(message);
    setPanel(null);
  };

  const count = presets.data?.length ?? 0;
  // A new search or filter keeps the previous rows on screen, dimmed, until its answer arrives.
  const searching = presets.isPlaceholderData;

  return (
    <>
      <PageHeader title="Presets" subtitle={`${studio.name} · the studio's library of strings, ready to audition, download or load into a session`} />
      <PresetUploadForm studioId={studioId} canManage={canManage} />

      <div className="mb-3 flex flex-wrap items-end gap-3">
        <h2 className="mr-auto text-lg font-semibold">Library</h2>
        <label className="flex min-w-56 flex-col gap-1 text-sm font-semibold">
          Search presets
          <input type="search" value={search} onChange={(event) => setSearch(event.target.value)} className={controlClass} placeholder="Name or description…" aria-describedby={`${ids}-count`} />
        </label>
        <label className="flex flex-col gap-1 text-sm font-semibold">
          Tag
          <select value={tag} onChange={(event) => setTag(event.target.value)} className={controlClass}>
            <option value="">All tags</option>
            {tagOptions.map((option) => (
              <option key={option} value={option}>
                {option}
              </option>
            ))}
          </select>
        </label>
        <label className="flex flex-col gap-1 text-sm font-semibold">
          Sort by
          <select value={sort} onChange={(event) => setSort(event.target.value as PresetSort)} className={controlClass}>
            {(Object.keys(SORT_LABELS) as PresetSort[]).map((option) => (
              <option key={option} value={option}>
                {SORT_LABELS[option]}
              </option>
            ))}
          </select>
        </label>
      </div>
      <p id={`${ids}-count`} role="status" className="mb-3 min-h-5 text-sm text-slate-700 dark:text-slate-300">
        {presets.isSuccess && (searching ? 'Searching…' : `${count} preset${count === 1 ? '' : 's'}${filtered ? ' match' : ''}`)}
      </p>

      {flash && (
        <div className="mb-4">
          <Notice tone="success">{flash}</Notice>
        </div>
      )}
      {panel?.action === 'details' && <PresetDetailsPanel key={panel.preset.id} preset={panel.preset} onClose={closePanel} />}
      {panel?.action === 'load' && <LoadIntoSessionPanel key={panel.preset.id} studioId={studioId} preset={panel.preset} onClose={closePanel} />}
      {panel?.action === 'tags' && <EditTagsPanel key={panel.preset.id} studioId={studioId} preset={panel.preset} onDone={finish} onClose={closePanel} />}
      {panel?.action === 'delete' && <DeletePresetPanel key={panel.preset.id} studioId={studioId} preset={panel.preset} onDone={finish} onClose={closePanel} />}

      {presets.isPending ? (
        <LoadingBlock label="Loading presets…" rows={LOADING_ROWS} />
      ) : presets.isError ? (
        <Notice tone="error" title="Cannot load the presets">
          {presets.error.message}
        </Notice>
      ) : presets.data.length === 0 ? (
        <EmptyState title={filtered ? 'No preset matches' : 'No presets yet'}>
          {filtered ? 'Try other words or another tag.' : canManage ? 'Upload a patch JSON file above to start the library.' : 'A lead can add presets from sessions or patch files.'}
        </EmptyState>
      ) : (
        <div aria-busy={searching || undefined} className={searching ? 'opacity-70 transition-opacity' : 'transition-opacity'}>
          {/* A new server order resets any header sort, so the two never disagree. */}
          <PresetsTable key={sort} presets={presets.data} canManage={canManage} canLoad={canLoad} onAction={openPanel} />
        </div>
      )}
    </>
  );
}
