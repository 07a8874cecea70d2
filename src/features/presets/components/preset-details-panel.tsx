import { useEffect, useId, useRef, useState } from 'react';
import type { PresetSummary } from '../../../../shared/api/responses';
import { ACTION_REASONS } from '../../../../shared/access/roles';
import { Button } from '../../../components/button';
import { LoadingBlock } from '../../../components/loading-block';
import { Notice } from '../../../components/notice';
import { usePreset } from '../api/get-preset';
import { designRecordLines } from '../design-record';
import { presetFigures } from '../preset-figures';
import { DeletePresetPanel } from './delete-preset-panel';
import { EditTagsPanel } from './edit-tags-panel';
import { LoadIntoSessionPanel } from './load-into-session-panel';
import { forPreset, TagChips } from './presets-table';

export type PresetAction = 'load' | 'tags' | 'delete';

export interface PresetDetailsPanelProps {
  studioId: string;
  preset: PresetSummary;
  /** Leads: edit tags and delete. */
  canManage: boolean;
  /** Leads and designers: load a preset into a session. */
  canLoad: boolean;
  /** Grows each time focus should move to the panel's title (the Details button asks; a row selection does not). */
  focusRequest: number;
  /** A tag edit or a deletion finished; `deleted` closes the panel. */
  onDone: (message: string, deleted: boolean) => void;
  onClose: () => void;
}

const hz = new Intl.NumberFormat('en', { maximumFractionDigits: 1, minimumFractionDigits: 1 });
const figure = new Intl.NumberFormat('en', { minimumSignificantDigits: 2, maximumSignificantDigits: 3 });
const plain = new Intl.NumberFormat('en', { maximumSignificantDigits: 4 });
const dateTime = new Intl.DateTimeFormat(undefined, { dateStyle: 'medium', timeStyle: 'short' });

const linkButton =
  'inline-flex items-center justify-center rounded-md border border-slate-700/30 bg-white px-4 py-2 text-sm font-semibold text-slate-900 hover:bg-white focus-visible:outline-2 focus-visible:outline-offset-2 focus-visible:outline-teal-400 dark:border-slate-300/20 dark:bg-slate-800 dark:text-slate-100 dark:hover:bg-slate-700';
const term = 'font-semibold text-slate-800 dark:text-slate-100';
const aside = 'text-slate-600 dark:text-slate-300';

/**
 * A preset beside the library table: its description, the figures read from its patch (length,
 * tension, f0 = √(T/μ) / 2L, damping and the first mode's T60), its design record, who saved it and
 * when, and the actions that look after the library, each kept to the roles allowed it. Escape closes.
 */
export function PresetDetailsPanel({ studioId, preset, canManage, canLoad, focusRequest, onDone, onClose }: PresetDetailsPanelProps) {
  const detail = usePreset(preset.id);
  const patch = detail.data?.patch;
  const figures = patch ? presetFigures(patch) : null;
  const design = patch ? designRecordLines(patch) : [];
  const [action, setAction] = useState<PresetAction | null>(null);
  const id = useId();
  const heading = useRef<HTMLHeadingElement>(null);
  const returnFocus = useRef<HTMLElement | null>(null);
  const manageReason = canManage ? undefined : ACTION_REASONS.managePresets;
  const loadReason = canLoad ? undefined : ACTION_REASONS.editSessions;

  useEffect(() => {
    if (focusRequest > 0) heading.current?.focus();
  }, [focusRequest]);
  // When an action's panel closes, focus goes back to the button that opened it.
  useEffect(() => {
    if (action || !returnFocus.current) return;
    if (returnFocus.current.isConnected) returnFocus.current.focus();
    returnFocus.current = null;
  }, [action]);

  const open = (next: PresetAction) => {
    returnFocus.current = document.activeElement instanceof HTMLElement ? document.activeElement : null;
    setAction(next);
  };
  const closeAction = () => setAction(null);

  return (
    <section
      aria-labelledby={id}
      // Focusable (not in the Tab order) so a click anywhere in the panel puts Escape within reach.
      tabIndex={-1}
      onKeyDown={(event) => {
        if (event.key === 'Escape') {
          event.stopPropagation();
          onClose();
        }
      }}
      className="rounded-lg border border-brass-500/40 bg-white p-4 outline-none dark:bg-slate-900"
    >
      <div className="flex items-start gap-2">
        <h2 id={id} ref={heading} tabIndex={-1} className="min-w-0 flex-1 break-words font-semibold outline-none focus-visible:outline-2 focus-visible:outline-teal-400">
          <span className="sr-only">Details — </span>“{preset.name}”
        </h2>
        <Button variant="ghost" className="-mr-2 -mt-1 px-2 py-1" aria-label="Close details" onClick={onClose}>
          <span aria-hidden="true">✕</span>
        </Button>
      </div>
      <p className="mt-1 text-xs text-slate-600 dark:text-slate-300">
        v{preset.version} · {preset.author?.displayName ?? 'unknown author'} · updated <time dateTime={preset.updatedAt}>{dateTime.format(new Date(preset.updatedAt))}</time>
      </p>

      <div className="mt-3 flex flex-wrap gap-2" role="group" aria-label="Preset actions">
        <a href={`/api/presets/${preset.id}/download`} download className={linkButton}>
          Download{forPreset(preset.name)}
        </a>
        <Button variant="secondary" disabledReason={loadReason} aria-expanded={action === 'load'} onClick={() => open('load')}>
          Load into session…{forPreset(`(${preset.name})`)}
        </Button>
        <Button variant="secondary" disabledReason={manageReason} aria-expanded={action === 'tags'} onClick={() => open('tags')}>
          Edit tags{forPreset(`of ${preset.name}`)}
        </Button>
        <Button variant="ghost" disabledReason={manageReason} aria-expanded={action === 'delete'} onClick={() => open('delete')}>
          Delete{forPreset(preset.name)}
        </Button>
      </div>
      {(!canManage || !canLoad) && (
        <p className="mt-2 text-xs text-slate-600 dark:text-slate-300">
          {[canLoad ? null : ACTION_REASONS.editSessions, canManage ? null : ACTION_REASONS.managePresets].filter(Boolean).join('; ').replace(/^./, (first) => first.toUpperCase())}.
        </p>
      )}

      {action && (
        <div className="mt-4">
          {action === 'load' && <LoadIntoSessionPanel studioId={studioId} preset={preset} onClose={closeAction} />}
          {action === 'tags' && (
            <EditTagsPanel
              studioId={studioId}
              preset={preset}
              onDone={(message) => {
                closeAction();
                onDone(message, false);
              }}
              onClose={closeAction}
            />
          )}
          {action === 'delete' && <DeletePresetPanel studioId={studioId} preset={preset} onDone={(message) => onDone(message, true)} onClose={closeAction} />}
        </div>
      )}

      <div className="mt-4 min-h-36 border-t border-slate-700/15 pt-3 dark:border-slate-300/10">
        {detail.isPending ? (
          <LoadingBlock label="Loading the preset…" rows={3} />
        ) : detail.isError ? (
          <Notice tone="error" title="Cannot load the preset">
            {detail.error.message}
          </Notice>
        ) : (
          figures &&
          patch && (
            <>
              <p className="text-sm">{detail.data.description || <span className={aside}>No description.</span>}</p>
              <dl className="mt-3 grid grid-cols-[max-content_minmax(0,1fr)] gap-x-4 gap-y-1.5 text-sm">
                <dt className={term}>Length</dt>
                <dd className="tabular-nums">{plain.format(patch.string.lengthM)} m</dd>
                <dt className={term}>Tension</dt>
                <dd className="tabular-nums">{plain.format(patch.string.tensionN)} N</dd>
                <dt className={term}>Fundamental</dt>
                <dd>
                  <span className="tabular-nums">{hz.format(figures.fundamentalHz)} Hz</span>{' '}
                  <span className={aside}>
                    (√(T/μ) / 2L; nearest note {figures.nearestNote}
                    {figures.centsFromNote !== 0 && `, ${figures.centsFromNote > 0 ? '+' : '−'}${Math.abs(figures.centsFromNote)} cents`})
                  </span>
                </dd>
                <dt className={term}>Damping</dt>
                <dd className="tabular-nums">
                  <span className="whitespace-nowrap">b₁ {plain.format(patch.damping.b1PerS)} s⁻¹,</span> <span className="whitespace-nowrap">b₂ {plain.format(patch.damping.b2M2PerS)} m²/s</span>
                </dd>
                <dt className={term}>First-mode decay</dt>
                <dd>
                  {figures.firstModeT60S === null ? (
                    'no loss: the first mode rings on'
                  ) : (
                    <>
                      <span className="tabular-nums">{figure.format(figures.firstModeT60S)} s</span> to fall 60 dB{' '}
                      <span className={aside}>(σ₁ = {figure.format(figures.firstModeDecayPerS)} s⁻¹)</span>
                    </>
                  )}
                </dd>
                <dt className={term}>Set-up</dt>
                <dd>{figures.summary}</dd>
                <dt className={term}>Tags</dt>
                <dd>
                  <TagChips tags={detail.data.tags} />
                </dd>
                <dt className={term}>Saved by</dt>
                <dd>{detail.data.author?.displayName ?? <span className={aside}>unknown</span>}</dd>
                <dt className={term}>Created</dt>
                <dd>
                  <time dateTime={detail.data.createdAt}>{dateTime.format(new Date(detail.data.createdAt))}</time>
                </dd>
                <dt className={term}>Updated</dt>
                <dd>
                  <time dateTime={detail.data.updatedAt}>{dateTime.format(new Date(detail.data.updatedAt))}</time>
                </dd>
              </dl>
              {design.length > 0 && (
                <details className="mt-3 text-sm">
                  <summary className="cursor-pointer font-semibold focus-visible:outline-2 focus-visible:outline-teal-400">Design record</summary>
                  <dl className="mt-2 grid grid-cols-[minmax(0,max-content)_minmax(0,1fr)] gap-x-4 gap-y-1">
                    {design.map((line) => (
                      <div key={line.label} className="contents">
                        <dt className={aside}>{line.label}</dt>
                        <dd className="break-words tabular-nums">{line.value}</dd>
                      </div>
                    ))}
                  </dl>
                </details>
              )}
            </>
          )
        )}
      </div>
    </section>
  );
}
