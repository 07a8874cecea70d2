import { useState, type FormEvent } from 'react';
import type { PresetSummary } from '../../../../shared/api/responses';
import { LIMITS } from '../../../../shared/limits';
import { Button } from '../../../components/button';
import { Notice } from '../../../components/notice';
import { TextField } from '../../../components/text-field';
import { useFieldErrors } from '../../../lib/use-field-errors';
import { updatePresetInputSchema, useUpdatePreset } from '../api/update-preset';
import { parseTags, tagsError } from '../tags';
import { ActionPanel } from './action-panel';

export interface EditTagsPanelProps {
  studioId: string;
  preset: PresetSummary;
  onDone: (message: string) => void;
  onClose: () => void;
}

/** Replaces a preset's tags with a comma-separated list (leads only; the server checks too). */
export function EditTagsPanel({ studioId, preset, onDone, onClose }: EditTagsPanelProps) {
  const update = useUpdatePreset(studioId);
  const fields = useFieldErrors();
  const [text, setText] = useState(preset.tags.join(', '));
  const error = tagsError(fields.errors);

  const submit = (event: FormEvent) => {
    event.preventDefault();
    const input = fields.check(updatePresetInputSchema, { tags: parseTags(text) });
    if (!input) return;
    update.mutate(
      { presetId: preset.id, input },
      { onSuccess: (saved) => onDone(saved.tags.length > 0 ? `Tags of “${saved.name}” saved: ${saved.tags.join(', ')}.` : `“${saved.name}” has no tags now.`), onError: fields.fromServer },
    );
  };

  return (
    <ActionPanel title={<>Edit tags of “{preset.name}”</>} onClose={onClose} focusTitle={false}>
      <form onSubmit={submit} noValidate className="flex flex-wrap items-start gap-3">
        <TextField
          className="min-w-64 flex-1"
          label="Tags"
          value={text}
          onChange={(event) => setText(event.target.value)}
          hint={`Separate tags with commas, e.g. nylon, warm, finger. At most ${LIMITS.maxPresetTags} tags of ${LIMITS.maxTagLength} characters.`}
          error={error}
          autoFocus
        />
        <Button type="submit" className="mt-6" busy={update.isPending}>
          Save tags
        </Button>
        <Button variant="ghost" className="mt-6" onClick={onClose}>
          Cancel
        </Button>
      </form>
      {update.isError && !error && <Notice tone="error">{update.error.message}</Notice>}
    </ActionPanel>
  );
}
