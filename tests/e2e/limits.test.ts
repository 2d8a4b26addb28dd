import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { baseUrl, demo, expectAccessible, launch, openPage, screenshot, shown, signIn, viewports, type ViewportName } from './browser';

let browser: Browser;
beforeAll(async () => {
  browser = await launch();
});
afterAll(() => browser.close());

describe.each(Object.keys(viewports) as ViewportName[])('the shop limits at %s width', (viewport) => {
  it('takes a clearance in mm, saves it in inches, refuses a word, and resets to the default', async () => {
    const { page, errors, close } = await openPage(browser, viewport);
    await signIn(page, demo.builder);
    await page.goto(`${baseUrl()}/settings`);
    await shown(page, 'limit-settings').waitFor();

    // 2.286 mm is 0.09 in (1 in = 25.4 mm exactly, NIST SP 811, Appendix B.8).
    await shown(page, 'unit-length-metric').click();
    await shown(page, 'limit-ptvIntake-min').fill('2.286');
    await shown(page, 'limit-ptvIntake-watchBand').fill('lots');
    await shown(page, 'limits-save').click();
    await expect.poll(() => shown(page, 'limit-ptvIntake-watchBand-error').textContent()).toBe('Shop watch band must be a number, in mm');
    await shown(page, 'limit-ptvIntake-watchBand').fill('');
    await shown(page, 'limits-save').click();
    await shown(page, 'limits-saved').waitFor();
    await expect.poll(() => shown(page, 'limit-ptvIntake-applies').textContent()).toContain('minimum 2.29 mm');
    expect(await shown(page, 'limit-ptvIntake-applies').textContent()).toContain('shop setting');

    const saved = await page.request.get(`${baseUrl()}/api/shop/limits`);
    const body = (await saved.json()) as { limits: { ptvIntake?: { min?: number; watchBand?: number } } };
    expect(body.limits.ptvIntake?.min).toBeCloseTo(0.09, 9);
    // The blank watch band stays the default, not zero.
    expect(body.limits.ptvIntake?.watchBand).toBeUndefined();
    await expectAccessible(page);
    await screenshot(page, `limits-${viewport}`);

    await shown(page, 'unit-length-imperial').click();
    await expect.poll(() => shown(page, 'limit-ptvIntake-min').inputValue()).toBe('0.090');
    expect(await shown(page, 'limit-ptvIntake-applies').textContent()).toContain('minimum 0.09 in');

    // Back to Lobewright's default, so the demo shop is as it was.
    await shown(page, 'limit-ptvIntake-reset').click();
    await shown(page, 'limits-save').click();
    await expect.poll(() => shown(page, 'limit-ptvIntake-applies').textContent()).toContain('common practice');
    expect(errors).toEqual([]);
    await close();
  });
});
