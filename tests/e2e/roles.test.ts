import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { baseUrl, demo, expectAccessible, launch, openPage, screenshot, shown, signIn, viewports, type ViewportName } from './browser';

let browser: Browser;
beforeAll(async () => {
  browser = await launch();
});
afterAll(() => browser.close());

describe.each(Object.keys(viewports) as ViewportName[])('each demo role at %s width', (viewport) => {
  it('shows the tech the jobs but no way to create one', async () => {
    const { page, errors, close } = await openPage(browser, viewport);
    await signIn(page, demo.tech);
    await page.getByTestId('jobs-screen').waitFor();
    await page.getByText('One-ton flatbed, 5.9 L pushrod V8 (demo)').first().waitFor();
    expect(await page.getByTestId('new-job').count()).toBe(0);
    await page.getByText('One-ton flatbed, 5.9 L pushrod V8 (demo)').first().click();
    await page.getByTestId('job-screen').waitFor();
    expect(await page.getByTestId('edit-job').count()).toBe(0);
    await screenshot(page, `tech-job-${viewport}`);
    expect(errors).toEqual([]);
    await close();
  });

  it.each([
    ['grinder', demo.grinder, /Grinder at Kestrel Valley Regrind \(demo\)/, 'incoming-screen'],
    ['customer', demo.customer, /Vehicle owner at Juniper Flats Engine Works \(demo\)/, 'my-jobs-screen'],
  ] as const)('keeps the %s out of the shop jobs and starts them where their work is', async (role, email, roleText, home) => {
    const { page, errors, close } = await openPage(browser, viewport);
    await signIn(page, email);
    await shown(page, home).waitFor();
    expect(await page.getByTestId('nav-jobs').count()).toBe(0);
    await page.goto(`${baseUrl()}/jobs`);
    await shown(page, home).waitFor();
    expect(await page.getByTestId('jobs-screen').count()).toBe(0);
    await shown(page, 'nav-account').click();
    await shown(page, 'account-screen').waitFor();
    await expect.poll(() => shown(page, 'account-role').textContent()).toMatch(roleText);
    await expectAccessible(page);
    await screenshot(page, `${role}-account-${viewport}`);
    expect(errors).toEqual([]);
    await close();
  });

  it('signs out back to the sign-in page', async () => {
    const { page, close } = await openPage(browser, viewport);
    await signIn(page, demo.builder);
    await page.getByTestId('nav-account').click();
    await page.getByTestId('sign-out').click();
    await page.getByTestId('sign-in-email').waitFor();
    await page.goto(`${baseUrl()}/jobs`);
    await page.getByTestId('sign-in-email').waitFor();
    await close();
  });
});
