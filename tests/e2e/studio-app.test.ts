import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../server/seed/demo-seed';
import { SCREENSHOTS_DIR as SHOTS, startE2eHarness, type E2eHarness } from '../support/e2e-harness';
import { testPatch } from '../support/patches';

let harness: E2eHarness;

beforeAll(async () => {
  harness = await startE2eHarness();
}, 180_000);

afterAll(() => harness?.close());

const newPage = (colorScheme: 'light' | 'dark' = 'light') => harness.newPage({ colorScheme });
const signIn = (page: Page, email: string, password: string) => harness.signIn(page, email, password);

/** Saves the page in both themes: the app follows the system scheme until someone picks one. */
async function screenshots(page: Page, name: string): Promise<void> {
  for (const scheme of ['light', 'dark'] as const) {
    await page.emulateMedia({ colorScheme: scheme });
    await page.waitForTimeout(50);
    await page.screenshot({ path: join(SHOTS, `${name}-${scheme}.png`), fullPage: true });
  }
  await page.emulateMedia({ colorScheme: 'light' });
}

const account = (role: string) => DEMO_ACCOUNTS.find((candidate) => candidate.role === role)!;

describe('the studio web app in a real browser', () => {
  it('registers a new account, signs out and in again, and creates a studio', async () => {
    const page = await newPage();
    await page.goto('/');
    await page.waitForURL(/\/sign-in\?next=/);
    await screenshots(page, 'sign-in');
    await page.getByRole('link', { name: 'Create an account' }).click();
    await page.getByLabel('Your name').fill('Marisol Teague');
    await page.getByLabel('E-mail').fill('marisol@saltglass.example');
    await page.getByLabel('Password').fill('short');
    await page.getByRole('button', { name: 'Create account' }).click();
    await page.getByText('Password must be at least 10 characters').waitFor();
    await screenshots(page, 'register-error');
    await page.getByLabel('Password').fill('quiet-harbour-42');
    await page.getByRole('button', { name: 'Create account' }).click();
    await page.waitForURL(/\/studios\/new$/);
    await page.getByRole('button', { name: 'Sign out' }).click();
    await page.waitForURL(/\/sign-in$/);
    await signIn(page, 'marisol@saltglass.example', 'quiet-harbour-42');
    await page.waitForURL(/\/studios\/new$/);
    await screenshots(page, 'create-studio');
    await page.getByLabel('Studio name').fill('Tidewater Foley');
    await page.getByRole('button', { name: 'Create studio' }).click();
    await page.waitForURL(/\/studios\/[0-9a-f-]+$/);
    await page.getByRole('heading', { name: 'Tidewater Foley' }).waitFor();
    await page.getByText('No sessions yet').waitFor();
  });

  it('shows the seeded lead the studio’s sessions, and starts and renames one', async () => {
    const page = await newPage();
    await signIn(page, account('lead').email, DEMO_PASSWORD);
    await page.getByRole('heading', { name: 'Kestrel Lantern Audio' }).waitFor();
    await page.getByRole('link', { name: 'Lighthouse stair climb' }).waitFor();
    await screenshots(page, 'studio-home');
    await page.getByLabel('Session name').fill('Gull cliff pluck');
    await page.getByRole('button', { name: 'Start session' }).click();
    await page.getByRole('link', { name: 'Gull cliff pluck' }).waitFor();
    await page.getByRole('button', { name: 'Rename Gull cliff pluck' }).click();
    await page.getByLabel('New name').fill('Gull cliff pluck, soft');
    await page.getByRole('button', { name: 'Save name' }).click();
    await page.getByRole('link', { name: 'Gull cliff pluck, soft' }).waitFor();
    await page.getByRole('link', { name: 'Gull cliff pluck, soft' }).click();
    await page.waitForURL(/\/sessions\//);
    await page.getByRole('region', { name: 'People here' }).waitFor();
    await screenshots(page, 'session');
  });

  it('a listener sees the sessions but no usable edit controls, and each says why', async () => {
    const page = await newPage();
    await signIn(page, account('listener').email, DEMO_PASSWORD);
    await page.getByRole('link', { name: 'Lighthouse stair climb' }).waitFor();
    const start = page.getByRole('button', { name: 'Start session' });
    await expect(start.isDisabled()).resolves.toBe(true);
    await expect(start.getAttribute('title')).resolves.toBe('only leads and designers can create or edit sessions');
    const rename = page.getByRole('button', { name: 'Rename Lighthouse stair climb' });
    await expect(rename.isDisabled()).resolves.toBe(true);
    await expect(page.getByRole('link', { name: 'Members' }).count()).resolves.toBe(0);
    await screenshots(page, 'studio-home-listener');
  });

  it('invites a new member, who opens the mail in the local mailbox, joins and lands in the studio as a designer', async () => {
    const lead = await newPage();
    await signIn(lead, account('lead').email, DEMO_PASSWORD);
    await lead.getByRole('link', { name: 'Members' }).click();
    await lead.getByRole('heading', { name: /Members/ }).first().waitFor();
    await lead.getByLabel('E-mail').fill('idris@kestrel-lantern.example');
    await lead.getByRole('combobox', { name: 'Role', exact: true }).selectOption('designer');
    await lead.getByRole('button', { name: 'Send invitation' }).click();
    await lead.getByText('idris@kestrel-lantern.example').first().waitFor();
    await screenshots(lead, 'members');

    const invitee = await newPage();
    await invitee.goto('/dev/mailbox');
    await invitee.getByText('Wren Halloway invited you to Kestrel Lantern Audio on Tautline').first().waitFor({ timeout: 15_000 });
    await screenshots(invitee, 'mailbox');
    await invitee.getByRole('link', { name: /invitations\/accept\?token=/ }).first().click();
    await invitee.waitForURL(/\/invitations\/accept\?token=/);
    await invitee.getByLabel('Your name').fill('Idris Vale');
    await invitee.getByLabel('Password').fill('breakwater-lamp-3');
    await screenshots(invitee, 'accept-invitation');
    await invitee.getByRole('button', { name: 'Create account and join' }).click();
    await invitee.waitForURL(/\/studios\/[0-9a-f-]+$/);
    await invitee.getByRole('heading', { name: 'Kestrel Lantern Audio' }).waitFor();
    await invitee.getByText('Sessions · you are a designer here').waitFor();
    await expect(invitee.getByRole('combobox', { name: 'Studio' }).inputValue()).resolves.toMatch(/[0-9a-f-]+/);
    await expect(invitee.getByRole('option', { name: 'Kestrel Lantern Audio (designer)' }).count()).resolves.toBe(1);
  });

  it('uploads a valid and an invalid patch file as presets: the preset appears, the field error shows', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'tautline-e2e-files-'));
    const good = join(dir, 'harbour-bell-wire.json');
    const bad = join(dir, 'broken-tension.json');
    writeFileSync(good, JSON.stringify(testPatch({ name: 'Harbour bell-wire' })));
    writeFileSync(bad, JSON.stringify({ ...testPatch({ name: 'Broken tension' }), string: { lengthM: 0.65, tensionN: -5, linearDensityKgPerM: 6e-4 } }));
    const page = await newPage();
    await signIn(page, account('lead').email, DEMO_PASSWORD);
    await page.getByRole('link', { name: 'Presets' }).click();
    await page.getByRole('heading', { name: 'Presets' }).waitFor();
    await page.getByText('Lantern Room Harp').first().waitFor();
    await screenshots(page, 'presets');

    await page.getByLabel('Patch JSON file').setInputFiles(bad);
    await page.getByRole('button', { name: 'Upload preset' }).click();
    await page.getByText('string.tensionN must be > 0, got -5').waitFor();
    await page.getByText('broken-tension.json was not accepted:').waitFor();
    await screenshots(page, 'presets-upload-error');

    await page.getByLabel('Patch JSON file').setInputFiles(good);
    await page.getByRole('button', { name: 'Upload preset' }).click();
    await page.getByRole('cell', { name: /Harbour bell-wire/ }).first().waitFor();
  });

  it('plays a preset only after the first-play caution, through the master volume', async () => {
    const page = await newPage();
    await signIn(page, account('producer').email, DEMO_PASSWORD);
    await page.getByRole('link', { name: 'Presets' }).click();
    await page.getByRole('button', { name: 'Play Lantern Room Harp' }).click();
    const caution = page.getByRole('alertdialog', { name: 'Before the first sound' });
    await caution.waitFor();
    await screenshots(page, 'audition-caution');
    await caution.getByRole('button', { name: 'Play at this level' }).click();
    await page.getByRole('button', { name: 'Stop Lantern Room Harp' }).waitFor({ timeout: 15_000 });
    // The caution is shown once per device.
    await page.getByRole('button', { name: 'Stop Lantern Room Harp' }).click();
    await page.getByRole('button', { name: 'Play Lantern Room Harp' }).click();
    await page.getByRole('button', { name: 'Stop Lantern Room Harp' }).waitFor({ timeout: 15_000 });
    await expect(page.getByRole('alertdialog').count()).resolves.toBe(0);
  });

  it('a listener sees the presets but cannot upload, edit tags or delete', async () => {
    const page = await newPage();
    await signIn(page, account('listener').email, DEMO_PASSWORD);
    await page.getByRole('link', { name: 'Presets' }).click();
    await page.getByText('Lantern Room Harp').first().waitFor();
    await expect(page.getByLabel('Patch JSON file').isDisabled()).resolves.toBe(true);
    // The actions sit in the details beside the table: open a preset's details first.
    await page.getByRole('row').filter({ hasText: 'Lantern Room Harp' }).first().getByRole('cell').nth(1).click();
    await page.getByRole('region', { name: 'Details — “Lantern Room Harp”' }).waitFor();
    const deletes = page.getByRole('button', { name: /^Delete/ });
    expect(await deletes.count()).toBeGreaterThan(0);
    for (const button of await deletes.all()) await expect(button.isDisabled()).resolves.toBe(true);
    await screenshots(page, 'presets-listener');
  });

  it('loads the sign-in page without the editor, audio or canvas code', async () => {
    const page = await newPage();
    const scripts: string[] = [];
    page.on('request', (request) => {
      if (request.resourceType() === 'script') scripts.push(request.url());
    });
    await page.goto('/sign-in');
    await page.getByRole('button', { name: 'Sign in' }).waitFor();
    expect(scripts.some((url) => /tone|konva|session-connection|yjs/i.test(url))).toBe(false);
    expect(scripts.some((url) => /sign-in-page/.test(url))).toBe(true);
  });
});
