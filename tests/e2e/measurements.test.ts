import path from 'node:path';
import zlib from 'node:zlib';

import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { baseUrl, demo, expectAccessible, launch, openPage, screenshot, shown, signIn, viewports, type ViewportName } from './browser';

const jobId = 'demo-job-flatbed-cam';
const demoCsv = path.resolve(__dirname, '..', '..', 'assets', 'demo', 'lobes-demo.csv');

let browser: Browser;
beforeAll(async () => {
  browser = await launch();
});
afterAll(() => browser.close());

/** CRC-32 as PNG chunks use it (ISO 3309). */
function crc32(bytes: Buffer): number {
  let c = ~0;
  for (const b of bytes) {
    c ^= b;
    for (let k = 0; k < 8; k++) c = c & 1 ? (c >>> 1) ^ 0xedb88320 : c >>> 1;
  }
  return ~c >>> 0;
}

function chunk(type: string, data: Buffer): Buffer {
  const length = Buffer.alloc(4);
  length.writeUInt32BE(data.length);
  const body = Buffer.concat([Buffer.from(type, 'ascii'), data]);
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(crc32(body));
  return Buffer.concat([length, body, crc]);
}

/** A valid 4×3 RGB PNG, a different shade each call so every upload is its own file. */
function tinyPng(shade: number): Buffer {
  const width = 4;
  const height = 3;
  const header = Buffer.alloc(13);
  header.writeUInt32BE(width, 0);
  header.writeUInt32BE(height, 4);
  header.set([8, 2, 0, 0, 0], 8);
  const rows: number[] = [];
  for (let y = 0; y < height; y++) {
    rows.push(0);
    for (let x = 0; x < width; x++) rows.push(shade % 256, (x * 60) % 256, (y * 80) % 256);
  }
  return Buffer.concat([
    Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
    chunk('IHDR', header),
    chunk('IDAT', zlib.deflateSync(Buffer.from(rows))),
    chunk('IEND', Buffer.alloc(0)),
  ]);
}

/** Presses a control that opens the browser's file picker and answers it. */
async function pickFiles(page: Page, testId: string, files: Parameters<import('playwright-core').FileChooser['setFiles']>[0]) {
  const chooser = page.waitForEvent('filechooser');
  await shown(page, testId).click();
  await (await chooser).setFiles(files);
}

async function fill(page: Page, values: Record<string, string>) {
  for (const [testId, value] of Object.entries(values)) await shown(page, testId).fill(value);
}

/** From the measurements screen: opens the fit checks and runs them, waiting for the new run in the history. */
async function runFitChecks(page: Page) {
  await shown(page, 'open-fit-checks').click();
  await shown(page, 'fit-checks-screen').waitFor();
  await shown(page, 'sheet-choice').waitFor();
  const runs = page.locator('[data-testid="fit-check-history"]:visible [role="listitem"]');
  const before = await runs.count();
  await shown(page, 'run-fit-checks').click();
  await expect.poll(() => runs.count(), { timeout: 15_000 }).toBe(before + 1);
}

describe.each(Object.keys(viewports) as ViewportName[])('the tech on the bench at %s width', (viewport) => {
  it('uploads lobes, records PTV and springs, runs fit checks, adds a photo and ticks the checklist', async () => {
    const { page, errors, close } = await openPage(browser, viewport);
    await signIn(page, demo.tech);
    await page.goto(`${baseUrl()}/jobs/${jobId}`);
    await shown(page, 'job-screen').waitFor();
    await shown(page, 'open-measurements').click();
    await shown(page, 'measurements-screen').waitFor();

    // A file with a bad cell is refused whole, and the message names the row and column.
    const bad = 'angle,1I,1E\n-10,0.010,0.000\n0,0.020,abc\n10,0.030,0.010\n20,0.040,0.020\n30,0.050,0.030\n40,0.060,0.040\n';
    await pickFiles(page, 'lobes-upload', { name: 'bad-lobes.csv', mimeType: 'text/csv', buffer: Buffer.from(bad) });
    const uploadError = shown(page, 'lobes-upload-error');
    await uploadError.waitFor();
    expect(await uploadError.textContent()).toMatch(/row 3, column 1E/i);

    // The demo table (invented): cylinder 3 exhaust is worn below its siblings.
    await pickFiles(page, 'lobes-upload', demoCsv);
    await expect.poll(() => shown(page, 'lobes-file').textContent(), { timeout: 15_000 }).toContain('lobes-demo.csv');
    expect(await shown(page, 'lobe-status-3E').textContent()).toMatch(/^Worn −0\.0\d\d$/);
    expect(await shown(page, 'lobe-status-3I').textContent()).toBe('OK');
    expect(await shown(page, 'lobes-worn-summary').textContent()).toContain('3E');
    expect(await page.locator('[data-testid="lobes-table"]:visible [role="row"]').count()).toBe(17);
    // The overlay starts on the worn lobe: measured curve over the sheet's lobe.
    // The plots arrive in their own chunk on first use: wait for the overlay, then count its curves.
    await expect.poll(() => shown(page, 'lobe-overlay').locator('path').count(), { timeout: 15_000 }).toBe(2);

    // PTV baseline with clay, one reading each side of TDC.
    await shown(page, 'ptv-method-clay').click();
    await fill(page, {
      'ptv-intake-0-crankAngle': '-10',
      'ptv-intake-0-clearance': '0.165',
      'ptv-exhaust-0-crankAngle': '10',
      'ptv-exhaust-0-clearance': '0.190',
    });
    await shown(page, 'ptv-save').click();
    await shown(page, 'ptv-saved').waitFor();

    // Lengths follow the unit toggle: 0.165 in shows as 4.19 mm (1 in = 25.4 mm exactly, NIST SP 811, Appendix B.8),
    // and 4.826 mm typed saves as 0.190 in.
    await shown(page, 'unit-length-metric').click();
    await expect.poll(() => shown(page, 'ptv-intake-0-clearance').inputValue()).toBe('4.19');
    await fill(page, { 'ptv-exhaust-0-clearance': '4.826' });
    await shown(page, 'ptv-save').click();
    await shown(page, 'ptv-saved').waitFor();
    const stored = await page.request.get(`${baseUrl()}/api/jobs/${jobId}/measurements`);
    const ptvRecord = (
      (await stored.json()) as { measurements: { kind: string; updatedAt: string; data: { exhaust: { clearance: number }[] } }[] }
    ).measurements
      .filter((m) => m.kind === 'ptv-baseline')
      .sort((a, b) => b.updatedAt.localeCompare(a.updatedAt))[0];
    expect(ptvRecord?.data.exhaust[0]?.clearance).toBeCloseTo(0.19, 9);
    await shown(page, 'unit-length-imperial').click();
    await expect.poll(() => shown(page, 'ptv-exhaust-0-clearance').inputValue()).toBe('0.190');

    // A spring out of range is named on its field; then a good one saves.
    await fill(page, {
      'springs-springs-0-where': 'all',
      'springs-springs-0-installedHeight': '1.800',
      'springs-springs-0-seatLoad': '9999',
      'springs-springs-0-rate': '380',
      'springs-springs-0-coilBindHeight': '1.150',
      'springs-springs-0-retainerToSeal': '0.650',
    });
    await shown(page, 'springs-save').click();
    await expect.poll(() => shown(page, 'springs-springs-0-seatLoad-error').textContent()).toContain('between 10 and 600 lbf');
    await fill(page, { 'springs-springs-0-seatLoad': '110' });
    await shown(page, 'springs-save').click();
    await shown(page, 'springs-saved').waitFor();

    // Degree wheel: stops at 20° BTDC and 24° ATDC put true TDC at 2° ATDC; flanks at 4° and 216° on the wheel are 2° and 214°
    // from true TDC, so the ICL is 108° (piston-stop method, common practice, no source).
    await fill(page, {
      'degree-stopBefore': '20',
      'degree-stopAfter': '24',
      'degree-openingAngle': '4',
      'degree-closingAngle': '216',
    });
    expect(await shown(page, 'degree-true-tdc').textContent()).toContain('2.0° ATDC');
    expect(await shown(page, 'degree-icl').textContent()).toBe('108.0° ATDC');
    const liveCorrection = (await shown(page, 'degree-compare').textContent()) ?? '';
    expect(liveCorrection).toMatch(/: (no correction needed|(advance|retard) the cam \d+\.\d°)\.$/);
    await shown(page, 'degree-save').click();
    await shown(page, 'degree-saved').waitFor();
    await expectAccessible(page);
    await screenshot(page, `measurements-${viewport}`);

    // Fit checks against the sheet's current revision.
    await runFitChecks(page);
    expect(await shown(page, 'fit-check-status').textContent()).toMatch(/^(Pass|Watch|Fail)$/);
    const ptvText = (await shown(page, 'fit-ptv').textContent()) ?? '';
    expect(ptvText).toMatch(/(Pass|Watch|Fail)Piston-to-valve, intake/);
    expect(ptvText).toMatch(/(Pass|Watch|Fail)Piston-to-valve, exhaust/);
    expect(ptvText).toContain('margin');
    const springText = (await shown(page, 'fit-springs').textContent()) ?? '';
    expect(springText).toMatch(/(Pass|Watch|Fail)Coil-bind margin/);
    expect(springText).toMatch(/(Pass|Watch|Fail)Retainer-to-seal/);
    expect(await shown(page, 'fit-lobes').textContent()).toMatch(/(Watch|Fail)Lobe wear \(3E\)/);
    expect(await shown(page, 'fit-lobes-passing').textContent()).toBe('15 other lobes pass.');
    expect(await shown(page, 'fit-degree').textContent()).toMatch(/(Pass|Watch|Fail)Cam degreed in/);
    expect(await shown(page, 'caution-ptv').textContent()).toContain('Predictions do not replace measurement');
    expect(await shown(page, 'caution-springs').textContent()).toContain('service manual');
    // One ICL and one correction: the fit check shows the measurements screen's own words (issue 14, finding 4).
    expect(await shown(page, 'fit-degree-icl').textContent()).toBe('108.0° ATDC');
    expect(await shown(page, 'fit-degree-detail').textContent()).toContain(liveCorrection);
    // The pushrod advice from the checking pushrod, the target preload and the base-circle cut (finding 5).
    expect(await shown(page, 'fit-pushrod-advice').textContent()).toMatch(
      /^Pushrods \d\.\d{3} in long for 0\.045 in preload: the checking pushrod's 7\.352 in at zero lash/,
    );
    await expectAccessible(page);
    await screenshot(page, `fit-checks-${viewport}`);

    // A blank old-cam valve lift is not measured: PTV intake does not run, names the reading, and the summary is not a verdict (findings 6, 7).
    await shown(page, 'open-measurements').click();
    await shown(page, 'measurements-screen').waitFor();
    const lift = shown(page, 'ptv-intake-1-valveLift');
    const savedLift = await lift.inputValue();
    expect(savedLift).not.toBe('');
    await lift.fill('');
    await shown(page, 'ptv-save').click();
    await shown(page, 'ptv-saved').waitFor();
    await runFitChecks(page);
    await expect
      .poll(() => shown(page, 'fit-ptv').textContent())
      .toContain("Not runPiston-to-valve, intake (intake)not measured: the old cam's valve lift for intake reading 2");
    expect(await shown(page, 'fit-check-status').textContent()).toMatch(/^((Fail|Watch) · )?\d+ of \d+ checks run$/);
    await screenshot(page, `fit-checks-not-run-${viewport}`);
    await shown(page, 'open-measurements').click();
    await shown(page, 'measurements-screen').waitFor();
    await shown(page, 'ptv-intake-1-valveLift').fill(savedLift);
    await shown(page, 'ptv-save').click();
    await shown(page, 'ptv-saved').waitFor();

    // A photo of the failed lifter on the job's findings.
    await page.goto(`${baseUrl()}/jobs/${jobId}`);
    await shown(page, 'job-screen').waitFor();
    await shown(page, 'photos-add').waitFor();
    const photos = page.locator('[data-testid="photos-list"]:visible [role="listitem"]');
    const photosBefore = await photos.count();
    const name = `lifter-${viewport}-${Date.now()}.png`;
    await pickFiles(page, 'photos-add', { name, mimeType: 'image/png', buffer: tinyPng(Date.now()) });
    await expect.poll(() => photos.count(), { timeout: 15_000 }).toBe(photosBefore + 1);
    const card = photos.filter({ hasText: name });
    await card.waitFor();
    await expect.poll(() => card.locator('img').evaluate((img) => (img as HTMLImageElement).naturalWidth)).toBe(4);

    // Tick a checklist item and see who and when.
    const tick = shown(page, 'checklist-tick-0');
    if ((await tick.getAttribute('aria-checked')) === 'true') {
      await tick.click();
      await expect.poll(() => tick.getAttribute('aria-checked')).toBe('false');
    }
    await tick.click();
    await expect.poll(() => tick.getAttribute('aria-checked')).toBe('true');
    expect(await shown(page, 'checklist-done-0').textContent()).toMatch(/^Done by Obie Lusk \(demo tech\), \w{3} \d{1,2}, \d{4}/);
    await expectAccessible(page);
    await screenshot(page, `job-bench-${viewport}`);

    // Delete the test photo (a second press confirms), so the demo job keeps only the photos people took.
    await card.locator('[data-testid="photo-delete"]').click();
    await card.locator('[data-testid="photo-delete-confirm"]').click();
    await expect.poll(() => photos.count()).toBe(photosBefore);
    expect(errors).toEqual([]);
    await close();
  });
});
