import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { baseUrl, demo, expectAccessible, launch, openPage, screenshot, shown, signIn, viewports, type ViewportName } from './browser';

let browser: Browser;
beforeAll(async () => {
  browser = await launch();
});
afterAll(() => browser.close());

const demoJob = 'One-ton flatbed, 5.9 L pushrod V8 (demo)';

/** Opens the demo job from the list and returns its id. */
async function openDemoJob(page: Page) {
  await shown(page, 'jobs-screen').getByText(demoJob).first().click();
  await page.waitForURL((url) => /^\/jobs\/[^/]+$/.test(url.pathname));
  return new URL(page.url()).pathname.split('/')[2]!;
}

const value = (page: Page, testId: string) => shown(page, testId).inputValue();

describe.each(Object.keys(viewports) as ViewportName[])('at %s width', (viewport) => {
  it('lets the builder edit the demo engine in either unit, and keeps the change after a reload', async () => {
    const { page, errors, close } = await openPage(browser, viewport);
    await signIn(page, demo.builder);
    const jobId = await openDemoJob(page);
    await page.goto(`${baseUrl()}/jobs/${jobId}/engine`);
    await shown(page, 'engine-bore').waitFor();
    expect(await value(page, 'engine-bore')).toBe('4.030');
    expect(await value(page, 'engine-chamberCc')).toBe('68.0');
    await expectAccessible(page);
    await screenshot(page, `engine-${viewport}`);

    await shown(page, 'unit-length-metric').click();
    await shown(page, 'unit-volume-in3').click();
    await expect.poll(() => value(page, 'engine-bore')).toBe('102.36');
    expect(await value(page, 'engine-chamberCc')).toBe('4.150');
    expect(await shown(page, 'engine-screen').getByText('Bore').first().textContent()).toContain('mm');
    await screenshot(page, `engine-metric-${viewport}`);

    // A coil-bind height above the installed height is refused on the field, in the words of the rule.
    await shown(page, 'engine-spring-coilBindHeight').fill('48.5');
    await shown(page, 'engine-save').click();
    await expect.poll(() => shown(page, 'engine-spring-coilBindHeight-error').textContent()).toBe('Coil-bind height must be below the installed height');
    // Typed in mm, 29.21 mm is 1.150 in.
    await shown(page, 'engine-spring-coilBindHeight').fill('29.21');

    await shown(page, 'unit-length-imperial').click();
    await shown(page, 'unit-volume-cc').click();
    await expect.poll(() => value(page, 'engine-bore')).toBe('4.030');
    expect(await value(page, 'engine-chamberCc')).toBe('68.0');
    expect(await value(page, 'engine-spring-coilBindHeight')).toBe('1.150');

    const seededSeatLoad = await value(page, 'engine-spring-seatLoad');
    const seatLoad = viewport === 'phone' ? '118' : '121';
    await shown(page, 'engine-spring-seatLoad').fill(seatLoad);
    await shown(page, 'engine-save').click();
    await expect.poll(() => shown(page, 'engine-notice-saved').textContent()).toMatch(/Engine saved \(version \d+\)/);

    await page.reload();
    await shown(page, 'engine-spring-seatLoad').waitFor();
    expect(await value(page, 'engine-spring-seatLoad')).toBe(seatLoad);
    expect(await value(page, 'engine-spring-coilBindHeight')).toBe('1.150');
    expect(await value(page, 'engine-bore')).toBe('4.030');

    // Put the demo engine back as seeded, for the tests that read it.
    await shown(page, 'engine-spring-seatLoad').fill(seededSeatLoad);
    await shown(page, 'engine-save').click();
    await expect.poll(() => shown(page, 'engine-notice-saved').textContent()).toMatch(/Engine saved/);
    expect(await value(page, 'engine-spring-seatLoad')).toBe(seededSeatLoad);
    expect(errors).toEqual([]);
    await close();
  });

  it('lets the builder write a library profile, naming the problem with a bad value', async () => {
    const { page, errors, close } = await openPage(browser, viewport);
    await signIn(page, demo.builder);
    await page.getByTestId('nav-profiles').click();
    await shown(page, 'profiles-screen').waitFor();
    await expect.poll(() => page.locator('[data-testid^="profile-card-"]:visible').count()).toBeGreaterThan(0);
    await expectAccessible(page);
    await screenshot(page, `profiles-${viewport}`);

    await shown(page, 'new-profile').click();
    await shown(page, 'profile-label').waitFor();
    const label = `Test mild tow ${viewport} ${Date.now()}`;
    await shown(page, 'profile-label').fill(label);
    await shown(page, 'profile-coreNotes').fill('Ground on the customer core; journals measured round.');
    const lobes = {
      intake: { duration050: '210', advertisedDuration: '200', lobeLift: '0.330' },
      exhaust: { duration050: '216', advertisedDuration: '274', lobeLift: '0.336' },
    };
    for (const [side, lobe] of Object.entries(lobes)) {
      for (const [field, text] of Object.entries(lobe)) await shown(page, `profile-${side}-${field}`).fill(text);
      await shown(page, `profile-${side}-advertisedHeight-pick-0.006`).click();
    }
    await shown(page, 'profile-lsa').fill('130');
    await shown(page, 'profile-icl').fill('108');
    await shown(page, 'profile-save').click();

    await expect.poll(() => shown(page, 'profile-lsa-error').textContent()).toBe('Lobe separation angle must be between 100 and 125 ° cam');
    await expect
      .poll(() => shown(page, 'profile-intake-advertisedDuration-error').textContent())
      .toBe('Advertised duration must be longer than the duration at 0.050 in');
    expect(await value(page, 'profile-intake-advertisedHeight')).toBe('0.006');
    await expectAccessible(page);
    await screenshot(page, `profile-errors-${viewport}`);

    await shown(page, 'profile-intake-advertisedDuration').fill('268');
    await shown(page, 'profile-lsa').fill('112');
    await shown(page, 'profile-save').click();
    await shown(page, 'profile-screen').getByRole('heading', { name: label }).waitFor();
    expect(new URL(page.url()).pathname).toMatch(/^\/profiles\/(?!new)[^/]+$/);
    expect(await value(page, 'profile-intake-advertisedDuration')).toBe('268');

    await page.getByTestId('nav-profiles').click();
    await shown(page, 'profiles-screen').getByText(label).waitFor();
    expect(errors).toEqual([]);
    await close();
  });
});
