import { ACTION_REASONS } from '../../../../shared/access/roles';
import type { RenderView } from '../../../../shared/renders/render-settings';
import { Button } from '../../../components/button';
import { ConfirmAction } from '../../../components/confirm-action';
import { DataTable, type Column } from '../../../components/data-table';
import { AuditionButton } from '../../../components/audition-button';
import { renderFileUrl, renderPatchUrl, renderPlayUrl } from '../api/render-file-urls';
import { isRenderActive } from '../apply-render-progress';
import { byteSize, lengthRuleSummary, noteSetSummary, outputSummary, signedNumber } from '../render-summary';
import { RenderState } from './render-state';

export interface RendersTableProps {
  renders: RenderView[];
  /** Leads and producers: cancel a job. */
  canExport: boolean;
  /** Leads: delete a render and its file. */
  canDelete: boolean;
  onCancel: (render: RenderView) => void;
  onDelete: (render: RenderView) => void;
  /** The render a cancel or delete is under way for. */
  busyId?: string;
}

const dateTime = new Intl.DateTimeFormat(undefined, { dateStyle: 'medium', timeStyle: 'short' });

const linkButton =
  'inline-flex items-center justify-center rounded-md border border-slate-700/30 bg-white px-3 py-2 text-sm font-semibold text-slate-900 hover:bg-white focus-visible:outline-2 focus-visible:outline-offset-2 focus-visible:outline-teal-400 dark:border-slate-300/20 dark:bg-slate-800 dark:text-slate-100 dark:hover:bg-slate-700';

const muted = 'text-xs text-slate-600 dark:text-slate-300';
const none = <span className="text-slate-600 dark:text-slate-300">—</span>;

/** The words a screen reader adds after a button's visible label, so each row's actions are told apart. */
const forRender = (text: string) => <span className="sr-only"> {text}</span>;

/** A measured level with one decimal, or a dash until the job is done. */
const level = (value: number | null) => (value === null ? none : signedNumber(value, 1, 1));

/**
 * The studio's renders, newest first as the server sends them (the headers re-sort): what each
 * was made from and with which settings, its measured figures once done, its progress while it
 * runs, and play, download, patch, cancel and delete in the row. Who made it and when share a column.
 */
export function RendersTable({ renders, canExport, canDelete, onCancel, onDelete, busyId }: RendersTableProps) {
  const columns: Column<RenderView>[] = [
    {
      key: 'name',
      header: 'Render',
      sortValue: (render) => render.name.toLowerCase(),
      render: (render) => (
        <div className="min-w-32 max-w-56">
          <p className="line-clamp-2 break-words font-semibold text-slate-900 dark:text-slate-100" title={render.name}>
            {render.name}
          </p>
          {render.kind === 'noteSet' && <p className={muted}>note set{render.fileCount !== null ? ` · ${render.fileCount} files` : ''}</p>}
        </div>
      ),
    },
    { key: 'state', header: 'State', render: (render) => <RenderState render={render} /> },
    {
      key: 'source',
      header: 'Source and settings',
      sortValue: (render) => render.source.name.toLowerCase(),
      render: (render) => (
        <div className="min-w-40 max-w-64">
          <p className="line-clamp-2 break-words" title={render.source.name}>
            {render.source.name} <span className={muted}>({render.source.kind})</span>
          </p>
          <p className="text-xs">{outputSummary(render.output)}</p>
          {render.noteSet && <p className="text-xs text-slate-600 dark:text-slate-300">{noteSetSummary(render.noteSet)}</p>}
        </div>
      ),
    },
    {
      key: 'length',
      header: 'Length (s)',
      sortValue: (render) => render.durationS ?? -1,
      className: 'tabular-nums',
      render: (render) => (
        <div>
          <p>{render.durationS === null ? none : render.durationS.toFixed(2)}</p>
          <p className={`${muted} max-w-32`}>{lengthRuleSummary(render.output.length)}</p>
        </div>
      ),
    },
    { key: 'peak', header: 'Peak (dBFS)', sortValue: (render) => render.peakDbfs ?? -Infinity, className: 'tabular-nums', render: (render) => level(render.peakDbfs) },
    { key: 'truePeak', header: 'True peak (dBTP)', sortValue: (render) => render.truePeakDbtp ?? -Infinity, className: 'tabular-nums', render: (render) => level(render.truePeakDbtp) },
    {
      key: 'loudness',
      header: 'Loudness (LUFS)',
      sortValue: (render) => render.integratedLufs ?? -Infinity,
      className: 'tabular-nums',
      render: (render) => (
        <div>
          <p>{level(render.integratedLufs)}</p>
          {render.levellingNote && <p className={`${muted} max-w-56`}>{render.levellingNote}</p>}
        </div>
      ),
    },
    { key: 'size', header: 'Size', sortValue: (render) => render.sizeBytes ?? -1, className: 'tabular-nums whitespace-nowrap', render: (render) => (render.sizeBytes === null ? none : byteSize(render.sizeBytes)) },
    {
      key: 'made',
      header: 'Made',
      sortValue: (render) => Date.parse(render.createdAt),
      render: (render) => (
        <div className="min-w-28">
          <time dateTime={render.createdAt}>{dateTime.format(new Date(render.createdAt))}</time>
          <p className={muted}>by {render.createdBy?.displayName ?? 'a former member'}</p>
        </div>
      ),
    },
    {
      key: 'actions',
      header: 'Actions',
      className: 'text-right',
      render: (render) => {
        const done = render.state === 'done';
        const busy = busyId === render.id;
        return (
          // relative: the screen-reader words are positioned absolutely and must stay inside the scrolling table.
          <div className="relative flex min-w-44 flex-wrap items-center justify-end gap-2">
            {done && render.kind === 'single' && <AuditionButton url={renderPlayUrl(render.id)} label={render.name} />}
            {done && (
              <a href={renderFileUrl(render.id)} download className={linkButton}>
                Download {render.kind === 'single' ? 'WAV' : 'ZIP'}
                {forRender(`of ${render.name}`)}
              </a>
            )}
            <a href={renderPatchUrl(render.id)} download className={linkButton}>
              Patch JSON{forRender(`of ${render.name}`)}
            </a>
            {isRenderActive(render.state) && (
              <Button variant="secondary" busy={busy} disabledReason={canExport ? undefined : ACTION_REASONS.exportRenders} onClick={() => onCancel(render)}>
                Cancel{forRender(render.name)}
              </Button>
            )}
            <ConfirmAction
              label="Delete"
              ariaLabel={`Delete ${render.name}`}
              question={`Delete “${render.name}” and its file for everyone?`}
              showQuestion
              confirmLabel="Delete file"
              cancelLabel="Keep it"
              busy={busy}
              disabledReason={canDelete ? undefined : ACTION_REASONS.deleteRenders}
              onConfirm={() => onDelete(render)}
            />
          </div>
        );
      },
    },
  ];

  return <DataTable caption="Renders of this studio" rows={renders} columns={columns} rowKey={(render) => render.id} />;
}
