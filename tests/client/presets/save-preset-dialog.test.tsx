// @vitest-environment happy-dom
import { cleanup, render, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { LIMITS } from '../../../shared/limits';
import { SavePresetDialog } from '../../../src/features/editor/components/save-preset-dialog';

/**
 * The editor's Save as preset dialog (invented studio Kestrel Lantern Audio): fields are checked
 * with the server's own schema before anything is sent, each problem shows once beside its field,
 * and typing in the field clears it.
 */

afterEach(cleanup);

function renderDialog(props: Partial<Parameters<typeof SavePresetDialog>[0]> = {}) {
  const onSave = vi.fn();
  const onCancel = vi.fn();
  render(<SavePresetDialog sessionId="session-lighthouse" defaultName="Lighthouse stair climb" onSave={onSave} onCancel={onCancel} {...props} />);
  const dialog = screen.getByRole('dialog', { name: 'Save this string as a preset' });
  return { onSave, onCancel, dialog, user: userEvent.setup() };
}

describe('save as preset dialog', () => {
  it("starts from the session's name and sends name, tags (lower-cased, trimmed) and description", async () => {
    const { onSave, dialog, user } = renderDialog();
    const name = within(dialog).getByRole('textbox', { name: 'Preset name' }) as HTMLInputElement;
    expect(name.value).toBe('Lighthouse stair climb');
    await user.clear(name);
    await user.type(name, '  Lighthouse climb, low wire ');
    await user.type(within(dialog).getByRole('textbox', { name: 'Tags' }), 'Harbour, , low ');
    await user.type(within(dialog).getByRole('textbox', { name: 'Description (optional)' }), 'The stair climb on a heavier wire.');
    await user.click(within(dialog).getByRole('button', { name: 'Save preset' }));
    expect(onSave).toHaveBeenCalledTimes(1);
    expect(onSave).toHaveBeenCalledWith({ name: 'Lighthouse climb, low wire', tags: ['harbour', 'low'], description: 'The stair climb on a heavier wire.' });
  });

  it('an empty name is refused beside the name field, once, nothing is sent, and typing clears it', async () => {
    const { onSave, dialog, user } = renderDialog();
    const name = within(dialog).getByRole('textbox', { name: 'Preset name' });
    await user.clear(name);
    await user.click(within(dialog).getByRole('button', { name: 'Save preset' }));
    expect(onSave).not.toHaveBeenCalled();
    expect(within(dialog).getAllByText('Must not be empty')).toHaveLength(1);
    expect(name.getAttribute('aria-invalid')).toBe('true');
    expect(name.getAttribute('aria-describedby')).toBeTruthy();
    await user.type(name, 'Gull wire');
    expect(within(dialog).queryByText('Must not be empty')).toBeNull();
    await user.click(within(dialog).getByRole('button', { name: 'Save preset' }));
    expect(onSave).toHaveBeenCalledWith({ name: 'Gull wire', tags: [] });
  });

  it('a tag over the length limit is named by its place, with the limit from shared/limits.ts', async () => {
    const { onSave, dialog, user } = renderDialog();
    await user.type(within(dialog).getByRole('textbox', { name: 'Tags' }), `steel, ${'w'.repeat(LIMITS.maxTagLength + 1)}`);
    await user.click(within(dialog).getByRole('button', { name: 'Save preset' }));
    expect(onSave).not.toHaveBeenCalled();
    expect(within(dialog).getByText(`Tag 2: must be at most ${LIMITS.maxTagLength} characters`)).toBeTruthy();
  });

  it("shows the server's field problems beside their fields, and a problem no field carries as a notice", () => {
    const { dialog } = renderDialog({ serverErrors: { name: 'Must be at most 120 characters' }, problem: 'Not allowed: only leads can save, edit or delete presets' });
    expect(within(dialog).getByText('Must be at most 120 characters')).toBeTruthy();
    expect(within(dialog).getByText('Not allowed: only leads can save, edit or delete presets')).toBeTruthy();
  });

  it('Cancel closes without saving', async () => {
    const { onSave, onCancel, dialog, user } = renderDialog();
    await user.click(within(dialog).getByRole('button', { name: 'Cancel' }));
    expect(onCancel).toHaveBeenCalledTimes(1);
    expect(onSave).not.toHaveBeenCalled();
  });
});
