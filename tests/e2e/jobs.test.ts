import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { baseUrl, demo, expectAccessible, launch, openPage, screenshot, shown, signIn, viewports, type ViewportName } from './browser';

let browser: Browser;
beforeAll(async () => {
  browser = await launch();
});
afterAll(() => browser.close());

describe.each(Object.keys(viewports) as ViewportName[])('at %s width', (viewport) => {
  it('shows an accessible sign-in page, and rejects a wrong password with a message', async () => {
    const { page, errors, close } = await openPage(browser, viewport);
    await page.goto(`${baseUrl()}/jobs`);
    await page.getByTestId('sign-in-email').waitFor();
    expect(new URL(page.url()).pathname).toBe('/sign-in');
    // The server started by `npm start` is a demo server, and says so on every screen with the fakes it runs.
    await expect
      .poll(() => page.getByTestId('demo-banner').textContent())
      .toMatch(/Demo server · invented data · test payments, no real money · mail kept in the dev mailbox/);
    await expectAccessible(page);
    await screenshot(page, `sign-in-${viewport}`);
    await page.getByTestId('sign-in-email').fill(demo.builder);
    await page.getByTestId('sign-in-password').fill('not-the-password');
    await page.getByTestId('sign-in-submit').click();
    await expect.poll(() => page.getByTestId('error-notice').textContent()).toMatch(/do not match/);
    expect(errors).toEqual([]);
    await close();
  });

  it('lets the demo builder create a job, see it in the list and open it', async () => {
    const { page, errors, close } = await openPage(browser, viewport);
    await signIn(page, demo.builder);
    await page.getByTestId('jobs-screen').waitFor();
    await page.getByText('One-ton flatbed, 5.9 L pushrod V8 (demo)').first().waitFor();
    await expectAccessible(page);
    await screenshot(page, `jobs-${viewport}`);

    const vehicle = `Test tow rig ${viewport} ${Date.now()}`;
    await page.getByTestId('new-job').click();
    await page.getByTestId('job-submit').click();
    await expect.poll(() => page.getByTestId('job-vehicle-error').textContent()).toMatch(/Describe the vehicle/);
    await page.getByTestId('job-vehicle').fill(vehicle);
    await page.getByTestId('job-customer').fill('Test Owner');
    await page.getByTestId('job-mileage').fill('98,500');
    await page.getByTestId('job-complaint').fill('Lifter tick at idle');
    await screenshot(page, `new-job-${viewport}`);
    await page.getByTestId('job-submit').click();

    await shown(page, 'job-screen').getByText('Test Owner · 98,500 mi').waitFor();
    // A new job stands at its first stage, and nothing after it is done.
    await expect.poll(() => shown(page, 'stage-findings-state').textContent()).toBe(' · Next');
    await expect.poll(() => shown(page, 'stage-returned-state').textContent()).toBe(' · Not yet');
    await screenshot(page, `job-${viewport}`);

    await page.getByTestId('nav-jobs').click();
    const card = shown(page, 'jobs-screen').getByText(vehicle);
    await card.waitFor();
    await card.click();
    await shown(page, 'job-complaint-text').filter({ hasText: 'Lifter tick at idle' }).waitFor();

    await shown(page, 'edit-job').click();
    await shown(page, 'job-findings').fill('Worn lobe on cylinder 5 intake');
    await shown(page, 'job-submit').click();
    await shown(page, 'job-findings-text').filter({ hasText: 'Worn lobe on cylinder 5 intake' }).waitFor();
    // Writing the findings moves the job on: the timeline is read again from the server.
    await expect.poll(() => shown(page, 'stage-findings-state').textContent()).toBe(' · Done');
    await expect.poll(() => shown(page, 'stage-measured-state').textContent()).toBe(' · Next');
    expect(errors).toEqual([]);
    await close();
  });
});
