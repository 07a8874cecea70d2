// @vitest-environment happy-dom
import { cleanup, screen, waitFor, within } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { NYLON_PATCH, STUDIO_ID } from './fake-api';
import { findPresetRow, presetNamesInTable, renderPresetsPage } from './presets-page-kit';

const UPLOAD = `/api/studios/${STUDIO_ID}/presets/upload`;
const LIST = `/api/studios/${STUDIO_ID}/presets`;

const patchFile = (name: string, patch: unknown = NYLON_PATCH) => new File([JSON.stringify(patch)], name, { type: 'application/json' });

const TENSION_ISSUE = { field: 'file.string.tensionN', problem: 'must be > 0', got: '-5', message: 'file.string.tensionN must be > 0, got -5' };

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

describe('presets page: uploading a patch file', () => {
  it('lists each problem the server finds under the file input, tied to it', async () => {
    const { api, user } = renderPresetsPage({
      role: 'lead',
      upload: { status: 422, body: { error: { code: 'invalid_patch', message: TENSION_ISSUE.message, field: TENSION_ISSUE.field, issues: [TENSION_ISSUE] } } },
    });
    await findPresetRow('Kelp-Line Nylon');
    const input = screen.getByLabelText('Patch JSON file') as HTMLInputElement;
    await user.upload(input, patchFile('slack-string.json', { ...NYLON_PATCH, string: { ...NYLON_PATCH.string, tensionN: -5 } }));
    await user.click(screen.getByRole('button', { name: 'Upload preset' }));

    const message = await screen.findByText('file.string.tensionN must be > 0, got -5');
    const problems = message.closest('[id]') as HTMLElement;
    expect(input.getAttribute('aria-describedby')?.split(' ')).toContain(problems.id);
    expect(input.getAttribute('aria-invalid')).toBe('true');
    expect(within(problems).getByText('slack-string.json was not accepted:')).toBeTruthy();
    expect(problems.getAttribute('role')).toBe('alert');
    expect(api.requestsTo('POST', UPLOAD)).toHaveLength(1);
    // Nothing was added.
    expect(presetNamesInTable()).toHaveLength(3);
  });

  it('shows a single server problem from its one-item issues list', async () => {
    const broken = { field: 'file', problem: 'broken.json is not valid JSON: Unexpected end of JSON input', got: null, message: 'file broken.json is not valid JSON: Unexpected end of JSON input' };
    const { user } = renderPresetsPage({
      role: 'lead',
      upload: { status: 400, body: { error: { code: 'invalid', message: broken.message, field: broken.field, issues: [broken] } } },
    });
    await findPresetRow('Kelp-Line Nylon');
    await user.upload(screen.getByLabelText('Patch JSON file'), new File(['{"name":'], 'broken.json', { type: 'application/json' }));
    await user.click(screen.getByRole('button', { name: 'Upload preset' }));
    expect(await screen.findByText('file broken.json is not valid JSON: Unexpected end of JSON input')).toBeTruthy();
  });

  it('asks for a file before sending anything', async () => {
    const { api, user } = renderPresetsPage({ role: 'lead' });
    await findPresetRow('Kelp-Line Nylon');
    await user.click(screen.getByRole('button', { name: 'Upload preset' }));
    expect(await screen.findByText('Choose a patch JSON file first.')).toBeTruthy();
    expect(api.requestsTo('POST', UPLOAD)).toHaveLength(0);
  });

  it('sends the file as multipart, then refetches the list and names the new preset', async () => {
    const { api, user } = renderPresetsPage({ role: 'lead' });
    await findPresetRow('Kelp-Line Nylon');
    const listRequestsBefore = api.requestsTo('GET', LIST).length;

    await user.upload(screen.getByLabelText('Patch JSON file'), patchFile('quayside.json'));
    expect(screen.getByText('quayside.json')).toBeTruthy();
    await user.type(screen.getByLabelText('Preset name (optional)'), 'Quayside Lamp Wire');
    await user.type(screen.getByLabelText('Tags (optional)'), 'steel, Bright');
    await user.click(screen.getByRole('button', { name: 'Upload preset' }));

    const row = await findPresetRow('Quayside Lamp Wire');
    expect(within(row).getAllByRole('listitem').map((chip) => chip.textContent)).toEqual(['steel', 'bright']);
    expect(await screen.findByText(/“Quayside Lamp Wire” is now in the studio's library/)).toBeTruthy();
    expect(api.requestsTo('GET', LIST).length).toBeGreaterThan(listRequestsBefore);
    expect(presetNamesInTable()).toContain('Quayside Lamp Wire');

    const [sent] = api.requestsTo('POST', UPLOAD);
    const form = sent.body as FormData;
    expect((form.get('file') as File).name).toBe('quayside.json');
    expect(form.get('name')).toBe('Quayside Lamp Wire');
    expect(form.get('tags')).toBe('steel, Bright');
    // The form is ready for the next file.
    await waitFor(() => expect((screen.getByLabelText('Preset name (optional)') as HTMLInputElement).value).toBe(''));
  });

  it('leaves out empty name and tags so the file keeps its own', async () => {
    const { api, user } = renderPresetsPage({ role: 'lead' });
    await findPresetRow('Kelp-Line Nylon');
    await user.upload(screen.getByLabelText('Patch JSON file'), patchFile('rope-locker.json'));
    await user.click(screen.getByRole('button', { name: 'Upload preset' }));
    await findPresetRow('rope-locker');
    const form = api.requestsTo('POST', UPLOAD)[0].body as FormData;
    expect(form.has('name')).toBe(false);
    expect(form.has('tags')).toBe(false);
  });
});
