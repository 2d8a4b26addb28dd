import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { baseUrl, demo, expectAccessible, launch, openPage, screenshot, shown, signIn } from './browser';

const jobId = 'demo-job-flatbed-cam';

let browser: Browser;
beforeAll(async () => {
  browser = await launch();
});
afterAll(() => browser.close());

/** The link in the mail whose subject matches, read in the dev mailbox as the signed-in person sees it. */
async function linkInMailbox(page: Page, subject: RegExp): Promise<string> {
  await page.goto(`${baseUrl()}/mailbox`);
  await shown(page, 'mailbox-screen').waitFor();
  const message = page.locator('[data-testid^="outbox-"][role="button"]:visible', { hasText: subject }).first();
  await expect
    .poll(
      async () => {
        await shown(page, 'outbox-refresh').click();
        return message.count();
      },
      { timeout: 15_000 },
    )
    .toBe(1);
  await message.click();
  const text = (await shown(page, 'mail-text').textContent()) ?? '';
  const link = text.match(/https?:\/\/\S+/g)?.at(-1);
  expect(link, `a link in the mail matching ${subject}`).toBeTruthy();
  return link!;
}

describe('a builder manages the team', () => {
  it('invites a tech, who verifies from the mailbox, joins and records a measurement; once removed, their next request is refused', async () => {
    const email = `new-tech-${Date.now()}@example.test`;
    const desk = await openPage(browser, 'wide');
    const d = desk.page;
    await signIn(d, demo.builder);
    await shown(d, 'nav-settings').click();
    await shown(d, 'team-settings').waitFor();
    await shown(d, 'invite-email').fill(email);
    await shown(d, 'invite-role-tech').click();
    await shown(d, 'invite-submit').click();
    await shown(d, 'invite-sent').waitFor();
    await shown(d, `invitation-${email}`).waitFor();
    expect(await shown(d, `invitation-${email}`).textContent()).toContain('Technician');
    await expectAccessible(d);
    await screenshot(d, 'team-invited-wide');

    // The tech, on a phone: signs up to join, reads their own mail, verifies.
    const phone = await openPage(browser, 'phone');
    const p = phone.page;
    await p.goto(`${baseUrl()}/sign-up?join=1`);
    await shown(p, 'sign-up-join-note').waitFor();
    await shown(p, 'sign-up-name').fill('New Bench Tech');
    await shown(p, 'sign-up-email').fill(email);
    await shown(p, 'sign-up-password').fill('bench-tech-passphrase');
    await shown(p, 'sign-up-submit').click();
    await p.waitForURL((url) => !url.pathname.startsWith('/sign-up'));
    const invitationLink = await linkInMailbox(p, /invited you to/);
    expect(new URL(invitationLink).pathname).toMatch(/^\/invitations\//);
    await p.goto(invitationLink);
    expect(await shown(p, 'invitation-status').textContent()).toMatch(/Verify your e-mail address first/);
    const verifyLink = await linkInMailbox(p, /Verify your e-mail/);
    await p.goto(verifyLink);
    await shown(p, 'verified-message').waitFor();
    await p.goto(invitationLink);
    expect(await shown(p, 'invitation-status').textContent()).toMatch(/You joined as technician/);
    await expectAccessible(p);
    await screenshot(p, 'team-joined-phone');

    // At work: a PTV reading on the demo job.
    await p.goto(`${baseUrl()}/jobs/${jobId}`);
    await shown(p, 'job-screen').waitFor();
    await shown(p, 'open-measurements').click();
    await shown(p, 'measurements-screen').waitFor();
    await shown(p, 'ptv-method-clay').click();
    for (const [testId, value] of Object.entries({
      'ptv-intake-0-crankAngle': '-10',
      'ptv-intake-0-clearance': '0.170',
      'ptv-exhaust-0-crankAngle': '10',
      'ptv-exhaust-0-clearance': '0.185',
    })) {
      await shown(p, testId).fill(value);
    }
    await shown(p, 'ptv-save').click();
    await shown(p, 'ptv-saved').waitFor();

    // The builder sees the tech on the team, then removes them.
    await d.reload();
    await shown(d, `member-${email}`).waitFor();
    expect(await d.locator(`[data-testid="invitation-${email}"]:visible`).count()).toBe(0);
    await shown(d, `member-${email}-remove`).click();
    await shown(d, `member-${email}-remove-confirm`).click();
    await expect.poll(() => d.locator(`[data-testid="member-${email}"]:visible`).count()).toBe(0);
    await screenshot(d, 'team-removed-wide');

    // The tech's very next request is refused, and the app no longer offers the shop's jobs.
    const next = await p.request.get(`${baseUrl()}/api/jobs/${jobId}`);
    expect(next.status()).toBe(403);
    await p.goto(`${baseUrl()}/`);
    await shown(p, 'account-screen').waitFor();
    expect(await p.locator('[data-testid="nav-jobs"]:visible').count()).toBe(0);

    expect(desk.errors).toEqual([]);
    expect(phone.errors).toEqual([]);
    await desk.close();
    await phone.close();
  });

  it('shows the team at phone width with every control reachable', async () => {
    const { page, errors, close } = await openPage(browser, 'phone');
    await signIn(page, demo.builder);
    await page.goto(`${baseUrl()}/settings`);
    await shown(page, 'team-settings').waitFor();
    await shown(page, `member-${demo.tech}`).waitFor();
    const box = await shown(page, `member-${demo.tech}-remove`).boundingBox();
    expect(box && box.x + box.width).toBeLessThanOrEqual(390);
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
    await expectAccessible(page);
    await screenshot(page, 'team-phone');
    expect(errors).toEqual([]);
    await close();
  });
});
