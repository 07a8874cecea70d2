import { useId, useRef, useState, type FormEvent } from 'react';
import type { PresetDetail } from '../../../../shared/api/responses';
import { ACTION_REASONS } from '../../../../shared/access/roles';
import { LIMITS } from '../../../../shared/limits';
import { Button } from '../../../components/button';
import { Notice } from '../../../components/notice';
import { TextField } from '../../../components/text-field';
import { ApiRequestError } from '../../../lib/api-error';
import { useFieldErrors } from '../../../lib/use-field-errors';
import { updatePresetInputSchema } from '../api/update-preset';
import { useUploadPreset } from '../api/upload-preset';
import { parseTags, tagsError } from '../tags';

/** Fields the form has its own input for; every other problem the server names is about the file. */
const isFormField = (field: string) => field === 'name' || field === 'tags' || field.startsWith('tags[');

const megabytes = (bytes: number) => `${(bytes / (1024 * 1024)).toLocaleString('en', { maximumFractionDigits: 1 })} MB`;
const fileSize = (bytes: number) => (bytes < 1024 ? `${bytes} bytes` : bytes < 1024 * 1024 ? `${Math.round(bytes / 1024)} kB` : megabytes(bytes));

/**
 * Adds a preset from a patch JSON file (a downloaded preset is one). The server checks the patch
 * field by field; its problems are listed under the file input, tied to it for screen readers.
 */
export function PresetUploadForm({ studioId, canManage }: { studioId: string; canManage: boolean }) {
  const upload = useUploadPreset(studioId);
  const fields = useFieldErrors();
  const fileInput = useRef<HTMLInputElement>(null);
  const [file, setFile] = useState<File | null>(null);
  const [name, setName] = useState('');
  const [tags, setTags] = useState('');
  const [fileProblems, setFileProblems] = useState<string[]>([]);
  const [uploaded, setUploaded] = useState<PresetDetail | null>(null);
  const id = useId();
  const reason = canManage ? undefined : ACTION_REASONS.managePresets;
  const tagsProblem = tagsError(fields.errors);
  const otherError = upload.isError && !(upload.error instanceof ApiRequestError && upload.error.issues.length > 0) ? upload.error.message : null;

  const submit = (event: FormEvent) => {
    event.preventDefault();
    setUploaded(null);
    upload.reset();
    const problems = !file
      ? ['Choose a patch JSON file first.']
      : file.size > LIMITS.maxPatchFileBytes
        ? [`${file.name} is ${megabytes(file.size)}; a patch file may be at most ${megabytes(LIMITS.maxPatchFileBytes)}.`]
        : [];
    // Name and tags follow the same rules as everywhere else; an empty name means the patch's own.
    const checked = fields.check(updatePresetInputSchema, { name: name.trim() || undefined, tags: parseTags(tags) });
    setFileProblems(problems);
    if (!file || problems.length > 0 || !checked) return;
    upload.mutate(
      { file, name, tags },
      {
        onSuccess: (preset) => {
          setUploaded(preset);
          setFile(null);
          setName('');
          setTags('');
          if (fileInput.current) fileInput.current.value = '';
        },
        onError: (error) => {
          fields.fromServer(error);
          setFileProblems(error instanceof ApiRequestError ? error.issues.filter((issue) => !isFormField(issue.field)).map((issue) => issue.message) : []);
        },
      },
    );
  };

  const describedBy = [`${id}-hint`, file ? `${id}-chosen` : null, fileProblems.length > 0 ? `${id}-problems` : null].filter(Boolean).join(' ');

  return (
    <section aria-labelledby={`${id}-title`} className="mb-8 rounded-lg border border-slate-700/15 p-4 dark:border-slate-300/10">
      <h2 id={`${id}-title`} className="font-semibold">
        Add a preset from a file
      </h2>
      {!canManage && <p className="mt-1 text-sm text-slate-700 dark:text-slate-300">You can browse, inspect and download presets; {reason}.</p>}
      <form onSubmit={submit} noValidate className="mt-3 grid gap-3 md:grid-cols-[minmax(0,1.4fr)_minmax(0,1fr)_minmax(0,1fr)_auto] md:items-start">
        <div className="flex flex-col gap-1">
          <label htmlFor={`${id}-file`} className="text-sm font-semibold text-slate-800 dark:text-slate-100">
            Patch JSON file
          </label>
          <input
            ref={fileInput}
            id={`${id}-file`}
            type="file"
            name="file"
            accept="application/json,.json"
            disabled={!canManage}
            aria-invalid={fileProblems.length > 0 ? true : undefined}
            aria-describedby={describedBy}
            onChange={(event) => {
              setFile(event.target.files?.[0] ?? null);
              setFileProblems([]);
              setUploaded(null);
            }}
            className={`rounded-md border bg-white text-sm text-slate-900 file:mr-3 file:border-0 file:bg-slate-100 file:px-3 file:py-2 file:font-semibold file:text-slate-900 focus-visible:outline-2 focus-visible:outline-offset-2 focus-visible:outline-teal-400 disabled:cursor-not-allowed disabled:opacity-60 dark:bg-slate-900 dark:text-slate-100 dark:file:bg-slate-800 dark:file:text-slate-100 ${
              fileProblems.length > 0 ? 'border-ember-500' : 'border-slate-700/30 dark:border-slate-300/20'
            }`}
          />
          <p id={`${id}-hint`} className="text-xs text-slate-600 dark:text-slate-300">
            A patch saved from a session or downloaded from this library, at most {megabytes(LIMITS.maxPatchFileBytes)}.
          </p>
          {file && (
            <p id={`${id}-chosen`} className="text-sm">
              <span className="font-semibold">{file.name}</span> <span className="text-slate-600 dark:text-slate-300">({fileSize(file.size)})</span>
            </p>
          )}
          {/* Space is kept for one line of problems so the form does not jump when they appear. */}
          <div id={`${id}-problems`} role={fileProblems.length > 0 ? 'alert' : undefined} className="min-h-5 text-sm text-ember-600 dark:text-ember-400">
            {fileProblems.length > 0 && (
              <>
                {file && <p>{file.name} was not accepted:</p>}
                <ul className="list-disc pl-5">
                  {fileProblems.map((problem) => (
                    <li key={problem}>{problem}</li>
                  ))}
                </ul>
              </>
            )}
          </div>
        </div>
        <TextField label="Preset name (optional)" value={name} onChange={(event) => setName(event.target.value)} hint="Empty: the patch's own name." error={fields.errors.name} disabled={!canManage} />
        <TextField label="Tags (optional)" value={tags} onChange={(event) => setTags(event.target.value)} hint="Comma-separated. Empty: the file's own tags." error={tagsProblem} disabled={!canManage} />
        <Button type="submit" className="md:mt-6" busy={upload.isPending} disabledReason={reason}>
          Upload preset
        </Button>
      </form>
      {uploaded && (
        <Notice tone="success" title="Preset added">
          “{uploaded.name}” is now in the studio&apos;s library{uploaded.tags.length > 0 ? `, tagged ${uploaded.tags.join(', ')}` : ''}.
        </Notice>
      )}
      {otherError && (
        <Notice tone="error" title="The upload failed">
          {otherError}
        </Notice>
      )}
    </section>
  );
}
