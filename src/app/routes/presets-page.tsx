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
import { PresetDetailsPanel } from '../../features/presets/components/preset-details-panel';
import { PresetUploadForm } from '../../features/presets/components/preset-upload-form';
import { PresetsTable } from '../../features/presets/components/presets-table';
import { tagsInUse } from '../../features/presets/tags';
import { useDebouncedValue } from '../../features/presets/use-debounced-value';
import NotFoundPage from './not-found-page';

const SORT_LABELS: Record<PresetSort, string> = { name: 'Name (A–Z)', date: 'Last updated (newest first)', author: 'Author (A–Z)' };
const SEARCH_DELAY_MS = 250;
const LOADING_ROWS = 6;

const controlClass =
  'rounded-md border border-slate-700/30 bg-white px-3 py-2 font-normal text-slate-900 focus-visible:outline-2 focus-visible:outline-teal-400 dark:border-slate-300/20 dark:bg-slate-900 dark:text-slate-100';

/**
 * The studio's preset library: find, audition and select presets in a compact table; the selected
 * preset's details and actions (download, load into a session; leads also retag and delete) sit
 * beside it on wide screens and below it on narrow ones. Leads also upload.
 */
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
  const [selected, setSelected] = useState<PresetSummary | null>(null);
  const [focusRequest, setFocusRequest] = useState(0);
  const [flash, setFlash] = useState<string | null>(null);
  const returnFocus = useRef<HTMLElement | null>(null);
  const details = useRef<HTMLDivElement>(null);
  const ids = useId();
  const detailsId = `${ids}-details`;

  // When the details close, focus goes back to the row or button that opened them (if still there).
  useEffect(() => {
    if (selected || !returnFocus.current) return;
    if (returnFocus.current.isConnected) returnFocus.current.focus();
    returnFocus.current = null;
  }, [selected]);
  // Below the table (narrow screens), a newly selected preset's details are brought into view.
  const selectedId = selected?.id ?? null;
  useEffect(() => {
    if (selectedId) details.current?.scrollIntoView?.({ block: 'nearest' });
  }, [selectedId]);

  if (me.isPending) return <LoadingBlock label="Loading the studio…" rows={LOADING_ROWS} />;
  if (!studio) return <NotFoundPage />;
  const canManage = can(studio.role, 'managePresets');
  const canLoad = can(studio.role, 'editSessions');
  const tagOptions = tagsInUse(allPresets.data ?? []);
  if (tag && !tagOptions.includes(tag)) tagOptions.push(tag);

  const select = (preset: PresetSummary, focusDetails: boolean) => {
    returnFocus.current = document.activeElement instanceof HTMLElement ? document.activeElement : null;
    if (preset.id !== selectedId) setFlash(null);
    setSelected(preset);
    if (focusDetails) setFocusRequest((count) => count + 1);
  };
  const closeDetails = () => setSelected(null);
  const finish = (message: string, deleted: boolean) => {
    setFlash(message);
    if (deleted) setSelected(null);
  };
  // The row's latest summary (after a tag edit, say); kept as it was when a filter hides the row.
  const shown = selected ? (presets.data?.find((preset) => preset.id === selected.id) ?? selected) : null;

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
      <div className="grid gap-6 xl:grid-cols-[minmax(0,1fr)_22rem] xl:items-start">
        <div className="min-w-0">
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
              <PresetsTable key={sort} presets={presets.data} selectedId={selectedId} detailsId={detailsId} onSelect={select} />
            </div>
          )}
        </div>
        <div id={detailsId} ref={details} className="min-w-0 scroll-mt-4 xl:sticky xl:top-4 xl:max-h-[calc(100vh-2rem)] xl:overflow-y-auto">
          {shown ? (
            <PresetDetailsPanel
              key={shown.id}
              studioId={studioId}
              preset={shown}
              canManage={canManage}
              canLoad={canLoad}
              focusRequest={focusRequest}
              onDone={finish}
              onClose={closeDetails}
            />
          ) : (
            presets.isSuccess &&
            count > 0 && (
              <p className="rounded-lg border border-dashed border-slate-700/25 p-4 text-sm text-slate-600 dark:border-slate-300/20 dark:text-slate-300">
                Select a preset to see its figures, design record and actions: download, load into a session, tags and deletion.
              </p>
            )
          )}
        </div>
      </div>
    </>
  );
}
