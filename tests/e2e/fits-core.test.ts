import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { baseUrl, demo, expectAccessible, launch, openPage, screenshot, shown, signIn, viewports, type ViewportName } from './browser';

let browser: Browser;
beforeAll(async () => {
  browser = await launch();
});
afterAll(() => browser.close());

describe.each(Object.keys(viewports) as ViewportName[])('fits the core at %s width', (viewport) => {
  it('the builder sees whether the towing profile can be ground from the damaged core, at what cut and what it does to preload; the sheet and the owner say it too', async () => {
    const { page, errors, close } = await openPage(browser, viewport);
    await signIn(page, demo.builder);
    await page.goto(`${baseUrl()}/jobs/demo-job-flatbed-cam/compare`);
    await shown(page, 'compare-screen').waitFor();

    // Compare: the stock-spec regrind fits the old cam; the towing profile does not, and the panel says where.
    await expect.poll(() => shown(page, 'fits-core-0-verdict').textContent(), { timeout: 15_000 }).toBe('Fits');
    expect(await shown(page, 'fits-core-1-verdict').textContent()).toBe('Does not fit');
    const stockHeadline = (await shown(page, 'fits-core-0-headline').textContent()) ?? '';
    const headline = (await shown(page, 'fits-core-1-headline').textContent()) ?? '';
    // Cut = stock base circle 1.250 − the towing profile's 1.200 in (demo data).
    expect(headline).toContain('Cannot be ground from the old cam at a 0.050 in cut');
    expect(headline).toMatch(/outside the old one/);
    expect(headline).toContain('needs a new core');
    expect(await shown(page, 'fits-core-1-figure-cut').textContent()).toContain('0.050 in');
    // The galled 3E lobe sets the cleanup: 2 × (0.012 + 0.005 allowance) ≈ 0.034 in.
    expect(await shown(page, 'fits-core-1-figure-cleanup').textContent()).toMatch(/exhaust lobe.*0\.034 in/);
    // The lifters drop half the cut: 0.025 in; preload 0.048 → 0.023 in with stock pushrods.
    const lifter = (await shown(page, 'fits-core-1-lifter').textContent()) ?? '';
    expect(lifter).toContain('The lifters sit 0.025 in lower');
    expect(lifter).toContain('preload falls to 0.023 in');
    const plot = shown(page, 'fits-core-1-plot');
    await plot.locator('path').first().waitFor();
    expect(await plot.locator('circle').count()).toBe(2);
    expect(await shown(page, 'fits-core-1-cautions').isVisible()).toBe(true);
    await expectAccessible(page);
    await screenshot(page, `fits-core-compare-${viewport}`);

    // The spec sheet: the same answer from its stored analysis, and the grinder's facts: cut, finishing stock, margin.
    await page.goto(`${baseUrl()}/jobs/demo-job-flatbed-cam/sheets/demo-sheet-flatbed-towing`);
    await shown(page, 'sheet-screen').waitFor();
    expect(await shown(page, 'sheet-fits-core-verdict').textContent()).toBe('Does not fit');
    // The compare test saves a towing revision with another intake duration before this file runs, so the towing
    // sheet's margin may differ from the profile's; it still cannot be ground from the old cam.
    const sheetHeadline = (await shown(page, 'sheet-fits-core-headline').textContent()) ?? '';
    expect(sheetHeadline).toMatch(/^Cannot be ground from the old cam at a 0\.050 in cut: .*outside the old one.*needs a new core\.$/);
    expect(await shown(page, 'sheet-core-cut').textContent()).toContain('0.050 in');
    expect(await shown(page, 'sheet-core-stock').textContent()).toContain('0.005 in');
    expect(await shown(page, 'sheet-core-margin').textContent()).toMatch(/−0\.0\d\d in/);
    expect(await shown(page, 'sheet-core-result').textContent()).toContain('does not fit the core');
    await screenshot(page, `fits-core-sheet-${viewport}`);

    // No test changes the stock-spec sheet: its stored answer is word for word what compare worked out.
    await page.goto(`${baseUrl()}/jobs/demo-job-flatbed-cam/sheets/demo-sheet-flatbed-stock`);
    await shown(page, 'sheet-screen').waitFor();
    expect(await shown(page, 'sheet-fits-core-verdict').textContent()).toBe('Fits');
    expect(await shown(page, 'sheet-fits-core-headline').textContent()).toBe(stockHeadline);
    expect(errors).toEqual([]);
    await close();

    // The owner, signed in: plain words on old cam or new core for each option.
    const owner = await openPage(browser, viewport);
    await signIn(owner.page, demo.customer);
    await shown(owner.page, 'my-jobs-screen').waitFor();
    await shown(owner.page, 'my-job').click();
    await expect.poll(() => shown(owner.page, 'owner-option-demo-option-towing-core').textContent(), { timeout: 15_000 }).toContain('Needs a new core');
    expect(await shown(owner.page, 'owner-option-demo-option-stock-core').textContent()).toContain('Your old camshaft will do');
    await screenshot(owner.page, `fits-core-owner-${viewport}`);
    expect(owner.errors).toEqual([]);
    await owner.close();
  });
});
