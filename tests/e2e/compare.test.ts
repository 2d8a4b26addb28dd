import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { baseUrl, demo, expectAccessible, launch, openPage, screenshot, shown, signIn, viewports, type ViewportName } from './browser';

let browser: Browser;
beforeAll(async () => {
  browser = await launch();
});
afterAll(() => browser.close());

describe.each(Object.keys(viewports) as ViewportName[])('compare and revise at %s width', (viewport) => {
  it('compares the demo profiles, edits the towing intake duration, and saves a new revision', async () => {
    const { page, errors, close } = await openPage(browser, viewport);
    await signIn(page, demo.builder);
    await page.goto(`${baseUrl()}/jobs/demo-job-flatbed-cam`);
    await shown(page, 'engine-summary').waitFor();
    await shown(page, 'open-compare').click();

    await shown(page, 'compare-screen').waitFor();
    const plot = shown(page, 'lift-plot');
    await plot.locator('path').first().waitFor();
    // Two profiles, intake and exhaust each.
    expect(await plot.locator('path').count()).toBe(4);
    // Overlap at 0.050 in (common practice, no source): stock (204 + 210)/2 − 2·114 = −21, towing (212 + 220)/2 − 2·112 = −8.
    await expect.poll(() => shown(page, 'cell-at050.overlap-0').textContent()).toContain('−21.0');
    await expect.poll(() => shown(page, 'cell-at050.overlap-1').textContent()).toContain('−8.0');
    expect(await shown(page, 'delta-at050.overlap-1').textContent()).toContain('+13.0');
    await expectAccessible(page);
    await screenshot(page, `compare-${viewport}`);

    // Each option saves into its own sheet: with the stock profile chosen, the button and the note name the stock sheet.
    const revisionsOf = async (id: string) =>
      ((await (await page.request.get(`${baseUrl()}/api/sheets/${id}`)).json()) as { sheet: { revisions: { id: string }[] } }).sheet.revisions.map((r) => r.id);
    const stockBefore = await revisionsOf('demo-sheet-flatbed-stock');
    await shown(page, 'edit-choice')
      .getByRole('radio', { name: /Stock-spec regrind/ })
      .click();
    await expect.poll(() => shown(page, 'save-to-sheet').textContent()).toMatch(/^Save to the “Stock-spec regrind \(demo\)” sheet as revision \d+$/);
    expect(await shown(page, 'sheet-target').textContent()).toContain('“Stock-spec regrind for the flatbed (demo)”');
    await screenshot(page, `compare-stock-target-${viewport}`);
    await shown(page, 'edit-choice')
      .getByRole('radio', { name: /Towing regrind/ })
      .click();
    await expect.poll(() => shown(page, 'save-to-sheet').textContent()).toMatch(/^Save to the “Towing regrind \(demo\)” sheet as revision \d+$/);
    expect(await shown(page, 'sheet-target').textContent()).toContain('“Replacement cam for the flatbed (demo)”');

    const before = await plot.locator('path').nth(3).getAttribute('d');
    // Try an intake duration the sheet does not hold yet, so every run writes a real change.
    const current = await page.request.get(`${baseUrl()}/api/sheets/demo-sheet-flatbed-towing`);
    const held = ((await current.json()) as { sheet: { current: { spec: { intake: { duration050: number } } } } }).sheet.current.spec.intake.duration050;
    const duration = held < 226 ? held + 2 : 214;
    // Overlap at 0.050 in = (Di + De)/2 − 2·LSA, IVC = Di/2 + ICL − 180 (common practice, no source), with De 220, LSA 112, ICL 108.
    const overlap = (duration + 220) / 2 - 224;
    const ivc = duration / 2 + 108 - 180;
    await shown(page, 'draft-intake-duration050').fill(String(duration));
    await expect.poll(() => shown(page, 'cell-at050.overlap-1').textContent()).toContain(`−${Math.abs(overlap).toFixed(1)}`);
    expect(await shown(page, 'delta-at050.overlap-1').textContent()).toContain(`+${(overlap + 21).toFixed(1)}`);
    expect(await shown(page, 'cell-at050.ivc-1').textContent()).toContain(ivc.toFixed(1));
    expect(await plot.locator('path').nth(3).getAttribute('d')).not.toBe(before);

    await shown(page, 'draft-icl').fill('300');
    await expect.poll(() => shown(page, 'draft-icl-error').textContent()).toMatch(/between 90 and 135/);
    expect(await shown(page, 'save-to-sheet').isDisabled()).toBe(true);
    await shown(page, 'draft-icl').fill('108');

    // Lengths follow the unit toggle: lobe lift shows in mm, a value typed in mm is worked out in inches (1 in = 25.4 mm),
    // and switching back shows it in inches. The 0.333 in saved lift is 8.4582 mm, shown to 2 decimals.
    const lift = shown(page, 'draft-intake-lobeLift');
    const savedLift = await lift.inputValue();
    await shown(page, 'unit-length-metric').click();
    await expect.poll(() => lift.inputValue()).toBe((Number(savedLift) * 25.4).toFixed(2));
    await lift.fill('9.00');
    await expect.poll(() => shown(page, 'cell-lobe.i-1').textContent()).toContain((9 / 25.4).toFixed(3));
    await lift.fill('99');
    await expect.poll(() => shown(page, 'draft-intake-lobeLift-error').textContent()).toMatch(/between [\d.]+ and [\d.]+ mm/);
    await lift.fill((Number(savedLift) * 25.4).toFixed(4));
    await shown(page, 'unit-length-imperial').click();
    await expect.poll(() => lift.inputValue()).toBe(savedLift);
    await expect.poll(() => shown(page, 'cell-lobe.i-1').textContent()).toContain(savedLift);

    const label = (await shown(page, 'save-to-sheet').textContent()) ?? '';
    const next = Number(/revision (\d+)/.exec(label)?.[1]);
    expect(next).toBeGreaterThan(1);
    await shown(page, 'save-to-sheet').click();
    await expect.poll(() => shown(page, 'save-result').textContent()).toContain(`Saved as revision ${next}`);
    // The towing values went into the towing sheet; the stock sheet holds what it held.
    expect(await revisionsOf('demo-sheet-flatbed-stock')).toEqual(stockBefore);
    expect((await revisionsOf('demo-sheet-flatbed-towing')).length).toBe(next);
    await screenshot(page, `compare-saved-${viewport}`);

    await shown(page, 'open-sheet').click();
    await shown(page, 'sheet-screen').waitFor();
    await shown(page, `history-${next}`).waitFor();
    await shown(page, `history-${next - 1}`).waitFor();
    expect(await shown(page, 'sheet-duration050').textContent()).toContain(`${duration}.0`);
    const diff = shown(page, 'revision-diff');
    await expect.poll(() => diff.textContent()).toContain('Intake duration at 0.050 in (°)');
    expect(await diff.textContent()).toMatch(new RegExp(`\\d+ → ${duration}`));
    await expectAccessible(page);
    await screenshot(page, `sheet-${viewport}`);
    expect(errors).toEqual([]);
    await close();
  });
});
