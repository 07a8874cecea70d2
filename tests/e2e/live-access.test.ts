import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { LIVE_ACCESS_MESSAGES } from '../../shared/protocol/live-access';
import { startE2eHarness, type E2eHarness } from '../support/e2e-harness';
import { openSessionFromList, screenshotsForReview, signedInDemoPage } from '../support/e2e-demo-pages';

/**
 * What a designer sees, in a real browser, when the lead changes their place in the studio while
 * they are in a session: read-only at once, editing again, the session archived, removed.
 */

let harness: E2eHarness;
const SESSION = 'Storm-surge chase pulse';

beforeAll(async () => {
  harness = await startE2eHarness();
}, 180_000);

afterAll(() => harness?.close());

const signedInPage = (role: string): Promise<Page> => signedInDemoPage(harness, role, SESSION);
const openSession = (page: Page): Promise<string> => openSessionFromList(page, SESSION);

const shoot = screenshotsForReview;

describe('live access in the editor', () => {
  it('a designer sees at once when the lead lowers their role, restores it, archives the session and removes them', async () => {
    const lead = await signedInPage('lead');
    const designer = await signedInPage('designer');
    const sessionId = await openSession(designer);
    const studioId = (await (await lead.request.get(`/api/sessions/${sessionId}`)).json()).session.studioId as string;
    const members = (await (await lead.request.get(`/api/studios/${studioId}/members`)).json()).members as Array<{ userId: string; role: string }>;
    const designerId = members.find((member) => member.role === 'designer')!.userId;
    const drawFreehand = designer.getByRole('radio', { name: 'Draw freehand' });
    expect(await drawFreehand.isDisabled()).toBe(false);

    expect((await lead.request.patch(`/api/studios/${studioId}/members/${designerId}`, { data: { role: 'listener' } })).status()).toBe(200);
    await designer.getByTestId('live-notice').filter({ hasText: LIVE_ACCESS_MESSAGES.readOnlyRole }).waitFor({ timeout: 2000 });
    await expect.poll(() => drawFreehand.isDisabled(), { timeout: 2000 }).toBe(true);
    await shoot(designer, 'live-access-read-only');

    expect((await lead.request.patch(`/api/studios/${studioId}/members/${designerId}`, { data: { role: 'designer' } })).status()).toBe(200);
    await designer.getByTestId('live-notice').filter({ hasText: LIVE_ACCESS_MESSAGES.writableRole }).waitFor({ timeout: 2000 });
    await expect.poll(() => drawFreehand.isDisabled(), { timeout: 5000 }).toBe(false);

    expect((await lead.request.patch(`/api/sessions/${sessionId}`, { data: { archived: true } })).status()).toBe(200);
    await designer.getByTestId('live-notice').filter({ hasText: LIVE_ACCESS_MESSAGES.readOnlyArchived }).waitFor({ timeout: 2000 });
    await expect.poll(() => drawFreehand.isDisabled(), { timeout: 2000 }).toBe(true);
    await shoot(designer, 'live-access-archived');
    // Opening the archived session afresh: watch and listen, and the page says why.
    await designer.reload();
    await designer.getByTestId('read-only-notice').filter({ hasText: LIVE_ACCESS_MESSAGES.readOnlyArchived }).waitFor({ timeout: 10_000 });
    await designer.getByTestId('result-figures').waitFor({ timeout: 20_000 }); // it can still be heard
    expect((await lead.request.patch(`/api/sessions/${sessionId}`, { data: { archived: false } })).status()).toBe(200);
    await expect.poll(() => drawFreehand.isDisabled(), { timeout: 5000 }).toBe(false);

    expect((await lead.request.delete(`/api/studios/${studioId}/members/${designerId}`)).status()).toBe(204);
    const ended = designer.getByTestId('live-access-ended');
    await ended.waitFor({ timeout: 2000 });
    expect(await ended.getAttribute('data-reason')).toBe('removed');
    // The page keeps the session as it was: the string and its last results stay on screen.
    await designer.waitForTimeout(1000);
    expect(await designer.getByTestId('result-figures').count()).toBe(1);
    await expect.poll(() => drawFreehand.isDisabled(), { timeout: 2000 }).toBe(true);
    await shoot(designer, 'live-access-removed');
  });
});
