import { useId, useState, type FormEvent } from 'react';
import { Button } from '../../../components/button';
import { FormField, formControlClass, describedByOf } from '../../../components/form-field';
import { Notice } from '../../../components/notice';
import { TextField } from '../../../components/text-field';
import { useFieldErrors } from '../../../lib/use-field-errors';
import { saveAsPresetInputSchema, type SaveAsPresetInput } from '../api/save-session-as-preset';

export interface SavePresetDialogProps {
  /** The session being saved; sent with the fields, as the server expects. */
  sessionId: string;
  /** What the name field starts with (the session's name). */
  defaultName: string;
  busy?: boolean;
  /** A problem the server reported that no field carries. */
  problem?: string;
  /** Field problems from the server, keyed by field (name, tags, tags[2], description). */
  serverErrors?: Record<string, string>;
  onSave: (input: SaveAsPresetInput) => void;
  onCancel: () => void;
}

/** Tags as people type them: comma-separated, trimmed, empty pieces dropped (the server lower-cases). */
function tagsFromText(text: string): string[] {
  return text
    .split(',')
    .map((tag) => tag.trim())
    .filter(Boolean);
}

/** One message for the tags field, naming the tag when one tag is at fault. */
function tagsProblem(errors: Record<string, string>): string | undefined {
  for (const [field, message] of Object.entries(errors)) {
    if (field === 'tags') return message;
    const index = /^tags\[(\d+)\]/.exec(field);
    if (index) return `Tag ${Number(index[1]) + 1}: ${message.charAt(0).toLowerCase()}${message.slice(1)}`;
  }
  return undefined;
}

/**
 * Save as preset: a name, tags and a description; the string itself is taken from the session as
 * everyone hears it when the lead presses Save. Fields are checked with the server's schema first.
 */
export function SavePresetDialog({ sessionId, defaultName, busy = false, problem, serverErrors = {}, onSave, onCancel }: SavePresetDialogProps) {
  const titleId = useId();
  const descriptionId = useId();
  const fields = useFieldErrors();
  const [name, setName] = useState(defaultName);
  const [tags, setTags] = useState('');
  const [description, setDescription] = useState('');
  // A field's problem stays until the field is typed in again (the server's until the next save).
  const [edited, setEdited] = useState<ReadonlySet<string>>(new Set());
  const errors = Object.fromEntries(Object.entries({ ...serverErrors, ...fields.errors }).filter(([field]) => !edited.has(field.replace(/\[\d+\]$/, ''))));
  const touched = (field: string) => setEdited((before) => new Set(before).add(field));
  const descriptionError = errors.description;

  const submit = (event: FormEvent) => {
    event.preventDefault();
    const input = fields.check(saveAsPresetInputSchema, { name, tags: tagsFromText(tags), description: description.trim() === '' ? undefined : description, sessionId });
    setEdited(new Set());
    if (!input) return;
    onSave({ name: input.name, tags: input.tags, ...(input.description ? { description: input.description } : {}) });
  };

  return (
    <section role="dialog" aria-labelledby={titleId} className="rounded-lg border border-brass-500/40 bg-white p-4 shadow-sm dark:bg-slate-900">
      <h2 id={titleId} className="font-semibold">
        Save this string as a preset
      </h2>
      <p className="mt-1 text-sm text-slate-700 dark:text-slate-300">The preset keeps the string, losses, pickup and render settings as everyone in the session hears them now.</p>
      <form onSubmit={submit} noValidate className="mt-3 grid gap-3 sm:grid-cols-2">
        <TextField label="Preset name" value={name} onChange={(event) => {
            setName(event.target.value);
            touched('name');
          }} error={errors.name} autoFocus />
        <TextField label="Tags" hint="Separated by commas, e.g. steel, bright, pluck" value={tags} onChange={(event) => {
            setTags(event.target.value);
            touched('tags');
          }} error={tagsProblem(errors)} />
        <FormField id={descriptionId} label="Description (optional)" error={descriptionError} className="sm:col-span-2">
          <textarea
            id={descriptionId}
            rows={2}
            value={description}
            onChange={(event) => {
              setDescription(event.target.value);
              touched('description');
            }}
            aria-invalid={descriptionError ? true : undefined}
            aria-describedby={describedByOf(descriptionId, descriptionError, undefined)}
            className={formControlClass(descriptionError)}
          />
        </FormField>
        {problem && (
          <div className="sm:col-span-2">
            <Notice tone="error">{problem}</Notice>
          </div>
        )}
        <div className="flex gap-2 sm:col-span-2">
          <Button type="submit" busy={busy}>
            Save preset
          </Button>
          <Button variant="ghost" onClick={onCancel} disabled={busy}>
            Cancel
          </Button>
        </div>
      </form>
    </section>
  );
}
