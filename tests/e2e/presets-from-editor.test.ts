import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ACTION_REASONS } from '../../shared/access/roles';
import type { Patch } from '../../shared/patch/patch-schema';
import { presetLoadedMessage } from '../../shared/protocol/live-access';
import { DEMO_ACCOUNTS } from '../../server/seed/demo-seed';
import { startE2eHarness, type E2eHarness } from '../support/e2e-harness';
import { openSessionFromList, screenshotsForReview, signedInDemoPage } from '../support/e2e-demo-pages';

/**
 * Presets from the editor, in a real browser against the app as `npm start` runs it (demo studio
 * Kestrel Lantern Audio): the lead loads a preset into the open session (asked first, a designer in
 * the session is told, Undo takes it back), saves the session as a new preset and finds it in the
 * library with the same patch; a producer sees Save as preset disabled with the reason, and the
 * API refuses the save.
 */

let harness: E2eHarness;
const SESSION = 'Lighthouse stair climb';
const LOADED = 'Breakwater Bass';
const SAVED = 'Lighthouse climb, low wire';

beforeAll(async () => {
  harness = await startE2eHarness();
}, 240_000);

afterAll(() => harness?.close());

const signedInPage = (role: string): Promise<Page> => signedInDemoPage(harness, role, SESSION);
const openSession = (page: Page): Promise<string> => openSessionFromList(page, SESSION, 30_000);

async function apiJson<T>(page: Page, url: string): Promise<T> {
  const response = await page.request.get(url);
  expect(response.status(), url).toBe(200);
  return (await response.json()) as T;
}

/** The sound of a patch: everything but its name (a label). */
const sound = (patch: Patch) => ({ ...patch, name: '' });

const shoot = screenshotsForReview;

describe('presets from the editor', () => {
  it('the lead loads a preset (asked first, everyone told, one undo), saves the session as a preset and finds it in the library', async () => {
    const lead = await signedInPage('lead');
    const designer = await signedInPage('designer');
    const sessionId = await openSession(lead);
    await openSession(designer);
    await lead.setViewportSize({ width: 1440, height: 900 });
    const { session: before } = await apiJson<{ session: { studioId: string; patch: Patch; sourcePreset: { name: string } | null } }>(lead, `/api/sessions/${sessionId}`);
    const studioId = before.studioId;
    const { presets } = await apiJson<{ presets: Array<{ id: string; name: string }> }>(lead, `/api/studios/${studioId}/presets`);
    const loadedId = presets.find((preset) => preset.name === LOADED)!.id;
    const { preset: loadedPreset } = await apiJson<{ preset: { patch: Patch } }>(lead, `/api/presets/${loadedId}`);
    expect(sound(loadedPreset.patch)).not.toEqual(sound(before.patch));

    // Load a preset into the open session: asked first.
    const controls = lead.getByRole('region', { name: 'Parameters' }).getByRole('region', { name: 'Presets' });
    await controls.getByRole('button', { name: 'From a preset…' }).click();
    await controls.getByLabel('Preset', { exact: true }).selectOption({ label: LOADED });
    await controls.getByRole('button', { name: 'Load into this session…' }).click();
    await controls.getByText(`Replace this session's string with “${LOADED}”?`).waitFor();
    await shoot(lead, 'presets-load-confirm');
    await controls.getByRole('button', { name: 'Yes, load it' }).click();
    // The designer, in the session, is told who loaded what.
    const leadName = DEMO_ACCOUNTS.find((account) => account.role === 'lead')!.displayName;
    await designer.getByTestId('live-notice').filter({ hasText: presetLoadedMessage(leadName, LOADED) }).waitFor({ timeout: 5000 });
    // The stored session follows the live document.
    await expect.poll(async () => sound((await apiJson<{ session: { patch: Patch } }>(lead, `/api/sessions/${sessionId}`)).session.patch), { timeout: 10_000 }).toEqual(sound(loadedPreset.patch));

    // One Undo takes the whole load back; Redo brings it again.
    await lead.getByRole('button', { name: 'Undo', exact: true }).click();
    await expect.poll(async () => sound((await apiJson<{ session: { patch: Patch } }>(lead, `/api/sessions/${sessionId}`)).session.patch), { timeout: 10_000 }).toEqual(sound(before.patch));
    await lead.getByRole('button', { name: 'Redo', exact: true }).click();
    await expect.poll(async () => sound((await apiJson<{ session: { patch: Patch } }>(lead, `/api/sessions/${sessionId}`)).session.patch), { timeout: 10_000 }).toEqual(sound(loadedPreset.patch));

    // Save as preset.
    await controls.getByRole('button', { name: 'Save as preset…' }).click();
    const dialog = lead.getByRole('dialog', { name: 'Save this string as a preset' });
    await dialog.getByLabel('Preset name').fill('');
    await dialog.getByRole('button', { name: 'Save preset' }).click();
    await dialog.getByText('Must not be empty').waitFor();
    await dialog.getByLabel('Preset name').fill(SAVED);
    await dialog.getByLabel('Tags').fill('harbour, low');
    await dialog.getByLabel('Description (optional)').fill('The stair climb on a heavier wire.');
    await shoot(lead, 'presets-save-dialog');
    await dialog.getByRole('button', { name: 'Save preset' }).click();
    await lead.getByTestId('preset-outcome').filter({ hasText: `Saved “${SAVED}” to the library` }).waitFor({ timeout: 5000 });
    // The session now comes from the new preset: Update preset names it.
    await controls.getByRole('button', { name: `Update preset “${SAVED}”` }).click();
    // Nothing changed since the save: the version stays.
    await lead.getByTestId('preset-outcome').filter({ hasText: `“${SAVED}” already sounds like this session: still version 1.` }).waitFor({ timeout: 5000 });
    await shoot(lead, 'presets-after-save');

    // In the library, with the same patch as the session.
    await lead.goto(`/studios/${studioId}/presets`);
    await lead.getByText(SAVED).first().waitFor({ timeout: 10_000 });
    const { presets: after } = await apiJson<{ presets: Array<{ id: string; name: string; tags: string[]; description: string }> }>(lead, `/api/studios/${studioId}/presets`);
    const saved = after.find((preset) => preset.name === SAVED)!;
    expect(saved).toMatchObject({ tags: ['harbour', 'low'], description: 'The stair climb on a heavier wire.' });
    const { preset: savedPreset } = await apiJson<{ preset: { patch: Patch; version: number } }>(lead, `/api/presets/${saved.id}`);
    const { session: now } = await apiJson<{ session: { patch: Patch } }>(lead, `/api/sessions/${sessionId}`);
    expect(sound(savedPreset.patch)).toEqual(sound(now.patch));
    expect(sound(savedPreset.patch)).toEqual(sound(loadedPreset.patch));
    expect(savedPreset.version).toBe(1);
  }, 180_000);

  it('a producer sees Save as preset disabled with the reason, and the API refuses the save', async () => {
    const producer = await signedInPage('producer');
    const sessionId = await openSession(producer);
    await producer.setViewportSize({ width: 1440, height: 900 });
    const save = producer.getByRole('region', { name: 'Presets' }).getByRole('button', { name: 'Save as preset…' });
    await save.waitFor();
    expect(await save.isDisabled()).toBe(true);
    expect(await save.getAttribute('title')).toBe(ACTION_REASONS.managePresets);
    await shoot(producer, 'presets-producer');
    const { session } = await apiJson<{ session: { studioId: string } }>(producer, `/api/sessions/${sessionId}`);
    const refused = await producer.request.post(`/api/studios/${session.studioId}/presets`, { data: { name: 'Not mine to keep', sessionId } });
    expect(refused.status()).toBe(403);
    expect((await refused.json()).error.message).toBe(`Not allowed: ${ACTION_REASONS.managePresets}`);
    const { presets } = await apiJson<{ presets: Array<{ name: string }> }>(producer, `/api/studios/${session.studioId}/presets`);
    expect(presets.map((preset) => preset.name)).not.toContain('Not mine to keep');
  }, 120_000);
});
