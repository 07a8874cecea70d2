import type { PresetSummary } from '../../../../shared/api/responses';
import { Button } from '../../../components/button';
import { LoadingBlock } from '../../../components/loading-block';
import { Notice } from '../../../components/notice';
import { usePreset } from '../api/get-preset';
import { presetFigures } from '../preset-figures';
import { ActionPanel } from './action-panel';
import { TagChips } from './presets-table';

const hz = new Intl.NumberFormat('en', { maximumFractionDigits: 1, minimumFractionDigits: 1 });
const figure = new Intl.NumberFormat('en', { minimumSignificantDigits: 2, maximumSignificantDigits: 3 });

/**
 * What a preset is, in figures read from its patch. Audition arrives with the audio engine in a
 * later release; until then this panel stands in for the sound.
 */
export function PresetDetailsPanel({ preset, onClose }: { preset: PresetSummary; onClose: () => void }) {
  const detail = usePreset(preset.id);
  const figures = detail.data ? presetFigures(detail.data.patch) : null;

  return (
    <ActionPanel title={<>Details — “{preset.name}”</>} onClose={onClose}>
      <p className="text-sm text-slate-700 dark:text-slate-300">No sound yet: audition comes with the audio engine in a later release. These figures come from the patch itself.</p>
      <div className="mt-3 min-h-36">
        {detail.isPending ? (
          <LoadingBlock label="Loading the preset…" rows={3} />
        ) : detail.isError ? (
          <Notice tone="error" title="Cannot load the preset">
            {detail.error.message}
          </Notice>
        ) : (
          figures && (
            <>
              <dl className="grid gap-x-6 gap-y-2 text-sm sm:grid-cols-[max-content_1fr]">
                <dt className="font-semibold">Fundamental</dt>
                <dd>
                  <span className="tabular-nums">{hz.format(figures.fundamentalHz)} Hz</span>{' '}
                  <span className="text-slate-600 dark:text-slate-300">
                    (√(T/μ) / 2L; nearest note {figures.nearestNote}
                    {figures.centsFromNote !== 0 && `, ${figures.centsFromNote > 0 ? '+' : '−'}${Math.abs(figures.centsFromNote)} cents`})
                  </span>
                </dd>
                <dt className="font-semibold">First-mode decay</dt>
                <dd>
                  {figures.firstModeT60S === null ? (
                    'no loss: the first mode rings on'
                  ) : (
                    <>
                      <span className="tabular-nums">{figure.format(figures.firstModeT60S)} s</span> to fall 60 dB{' '}
                      <span className="text-slate-600 dark:text-slate-300">(σ₁ = {figure.format(figures.firstModeDecayPerS)} s⁻¹)</span>
                    </>
                  )}
                </dd>
                <dt className="font-semibold">Set-up</dt>
                <dd>{figures.summary}</dd>
                <dt className="font-semibold">Tags</dt>
                <dd>
                  <TagChips tags={detail.data.tags} />
                </dd>
                <dt className="font-semibold">Description</dt>
                <dd>{detail.data.description || <span className="text-slate-600 dark:text-slate-300">No description.</span>}</dd>
              </dl>
            </>
          )
        )}
      </div>
      <div className="mt-3 flex justify-end">
        <Button variant="ghost" onClick={onClose}>
          Close details
        </Button>
      </div>
    </ActionPanel>
  );
}
