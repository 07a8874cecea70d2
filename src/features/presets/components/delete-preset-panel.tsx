import type { PresetSummary } from '../../../../shared/api/responses';
import { Button } from '../../../components/button';
import { Notice } from '../../../components/notice';
import { useDeletePreset } from '../api/delete-preset';
import { ActionPanel } from './action-panel';

export interface DeletePresetPanelProps {
  studioId: string;
  preset: PresetSummary;
  onDone: (message: string) => void;
  onClose: () => void;
}

/** The confirmation step before a preset is deleted. */
export function DeletePresetPanel({ studioId, preset, onDone, onClose }: DeletePresetPanelProps) {
  const remove = useDeletePreset(studioId);
  return (
    <ActionPanel title={<>Delete “{preset.name}”?</>} onClose={onClose} tone="danger">
      <p className="text-sm">
        The preset leaves the studio&apos;s library for everyone. Sessions that already loaded it keep their own copy of the string. This cannot be undone, so download it first if you may want it back.
      </p>
      <div className="mt-3 flex flex-wrap gap-3">
        <Button variant="danger" busy={remove.isPending} onClick={() => remove.mutate(preset.id, { onSuccess: () => onDone(`“${preset.name}” deleted.`) })}>
          Delete preset
        </Button>
        <Button variant="ghost" onClick={onClose}>
          Keep it
        </Button>
      </div>
      {remove.isError && (
        <div className="mt-3">
          <Notice tone="error">{remove.error.message}</Notice>
        </div>
      )}
    </ActionPanel>
  );
}
