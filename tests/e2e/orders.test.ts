import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { baseUrl, demo, expectAccessible, launch, openPage, screenshot, shown, signIn, viewports, type ViewportName } from './browser';

const sheetPath = '/jobs/demo-job-flatbed-cam/sheets/demo-sheet-flatbed-towing';
const grinderName = /Kestrel Valley Regrind \(demo\)/;

let browser: Browser;
beforeAll(async () => {
  browser = await launch();
});
afterAll(() => browser.close());

/** The builder reloads the sheet page and waits for this revision's order to show the stage. */
async function builderSees(page: Page, revision: number, stage: string) {
  await page.goto(`${baseUrl()}${sheetPath}`);
  await shown(page, 'sheet-screen').waitFor();
  await expect.poll(() => shown(page, `sheet-order-stage-${revision}`).textContent()).toBe(stage);
}

/**
 * The builder issues the towing sheet's current draft to the demo grinding shop, after starting a fresh draft when the
 * latest revision is already issued; answers the revision number and the new order's id.
 */
async function issueDraft(b: Page, note: string) {
  await b.goto(`${baseUrl()}${sheetPath}`);
  await shown(b, 'sheet-screen').waitFor();
  if ((await shown(b, 'revision-state').textContent()) === 'Issued') {
    await shown(b, 'sheet-note').fill(`Regrind on the customer's core; browser run ${Date.now()}.`);
    await shown(b, 'save-note').click();
    await expect.poll(() => shown(b, 'revision-state').textContent()).toBe('Draft');
  }
  const subtitle = (await shown(b, 'sheet-screen').textContent()) ?? '';
  const revision = Number(/Revision (\d+) \(draft/.exec(subtitle)?.[1]);
  expect(revision).toBeGreaterThan(0);

  // Issue to the demo grinding shop, with a confirm step.
  await shown(b, 'issue-shop').getByRole('radio', { name: grinderName }).click();
  await shown(b, 'issue-note').fill(note);
  await shown(b, 'issue-start').click();
  await expect.poll(() => shown(b, 'issue-confirm-box').textContent()).toContain(`Send revision ${revision}`);
  await expectAccessible(b);
  await shown(b, 'issue-confirm').click();
  await expect.poll(() => shown(b, 'revision-state').textContent()).toBe('Issued');
  await expect.poll(() => shown(b, `sheet-order-stage-${revision}`).textContent()).toBe('Sent to grinder');
  await shown(b, 'issue-frozen').waitFor();
  const orderHref = (await shown(b, `open-order-${revision}`).getAttribute('href')) ?? '';
  const orderId = /\/orders\/([^/?#]+)/.exec(orderHref)?.[1] ?? '';
  expect(orderId).not.toBe('');
  return { revision, orderId };
}

describe.each(Object.keys(viewports) as ViewportName[])('grind order from issue to shipped at %s width', (viewport) => {
  it('builder issues the demo sheet, the grinder quotes, grinds and ships it, the builder follows each stage', async () => {
    const builder = await openPage(browser, viewport);
    const grinder = await openPage(browser, viewport);
    const b = builder.page;
    const g = grinder.page;

    // Builder: the sheet's title, then issue its draft (a fresh one when an earlier run left the latest revision issued).
    await signIn(b, demo.builder);
    await b.goto(`${baseUrl()}${sheetPath}`);
    await shown(b, 'sheet-screen').waitFor();
    const sheetTitle = (await shown(b, 'sheet-screen').locator('[role="heading"][aria-level="1"]').first().textContent()) ?? '';
    expect(sheetTitle.length).toBeGreaterThan(0);
    const { revision, orderId } = await issueDraft(b, 'Core is the original; keep the base circle as stated.');
    await expectAccessible(b);
    await screenshot(b, `orders-sheet-issued-${viewport}`);

    // Grinder: the inbox starts them, and the new sheet is there with its revision.
    await signIn(g, demo.grinder);
    await shown(g, 'incoming-screen').waitFor();
    const card = shown(g, `incoming-${orderId}`);
    await expect.poll(() => card.textContent()).toContain(`Revision ${revision}`);
    expect(await card.textContent()).toContain('Juniper Flats Engine Works (demo)');
    expect(await card.textContent()).toContain('Sent to grinder');
    expect(await card.textContent()).toMatch(/Sent (just now|\d+ (minute|hour|day)s? ago)/);
    await expectAccessible(g);
    await screenshot(g, `orders-incoming-${viewport}`);

    // Grinder: open it, check the checksum matches the builder's, quote.
    await card.click();
    await shown(g, 'order-screen').waitFor();
    const checksum = ((await shown(g, 'order-checksum').textContent()) ?? '').trim();
    expect(checksum).toMatch(/^[0-9a-f]{12}$/);
    await shown(b, `open-order-${revision}`).click();
    await shown(b, 'order-screen').waitFor();
    expect(((await shown(b, 'order-checksum').textContent()) ?? '').trim()).toBe(checksum);
    expect(await shown(g, 'order-revision').textContent()).toContain(String(revision));
    expect(await shown(g, 'order-notes').textContent()).toBeTruthy();
    // The towing profile's core notes travel with the revision to the grinder (demo data).
    expect(await shown(g, 'order-core-notes').textContent()).toContain('Check piston-to-valve clearance with clay');
    expect(await shown(g, 'order-screen').textContent()).toContain('Lifters');
    // Events read on their side of the dead centre: the sheet says so, and no event carries a minus sign.
    expect(await shown(g, 'sheet-event-convention').textContent()).toMatch(/never negative/);
    for (const text of await shown(g, 'order-screen')
      .getByText(/° (BTDC|ATDC|BBDC|ABDC)$/)
      .allTextContents())
      expect(text).not.toMatch(/[-−]/);
    expect(
      await shown(g, 'order-screen')
        .getByText(/° (BTDC|ATDC|BBDC|ABDC)$/)
        .count(),
    ).toBeGreaterThanOrEqual(10);
    // The grinder's moves from "sent" are quote or ask for changes; the builder has none yet.
    expect(await shown(b, 'order-screen').getByTestId('order-moves').count()).toBe(0);
    await shown(g, 'move-quoted').click();
    await shown(g, 'confirm-quoted').click();
    await expect.poll(() => shown(g, 'quote-price-error').textContent()).toContain('price in dollars');
    await shown(g, 'quote-price').fill('485.00');
    await shown(g, 'quote-lead-time').fill('6');
    await expectAccessible(g);
    await screenshot(g, `orders-quote-form-${viewport}`);
    await shown(g, 'confirm-quoted').click();
    await expect.poll(() => shown(g, 'order-stage').textContent()).toBe('Accepted and quoted');
    expect(await shown(g, 'order-quote').textContent()).toContain('$485.00');
    await builderSees(b, revision, 'Accepted and quoted');
    expect(await shown(b, `sheet-order-quote-${revision}`).textContent()).toContain('6 days');
    expect(await shown(b, `sheet-order-firm-${revision}`).textContent()).toBe('Request for a quote');

    // A request for a quote is not ground: the grinder has no grinding move until the builder confirms it (this shop
    // skips the owner step for this job, with a reason for the record).
    expect(await shown(g, 'order-firmness').textContent()).toBe('Request for a quote');
    expect(await shown(g, 'order-firmness-text').textContent()).toMatch(/do not grind it/);
    expect(await shown(g, 'order-screen').getByTestId('move-grinding').count()).toBe(0);
    await b.goto(`${baseUrl()}/orders/${orderId}`);
    await shown(b, 'order-screen').waitFor();
    await shown(b, 'confirm-reason').fill('Fleet account (demo): the fleet manager signed off by phone');
    await expectAccessible(b);
    await screenshot(b, `orders-builder-confirm-${viewport}`);
    await shown(b, 'confirm-order-submit').click();
    await expect.poll(() => shown(b, 'order-firmness').textContent()).toBe('Firm order');
    expect(await shown(b, 'order-firmness-text').textContent()).toContain('fleet manager signed off');
    await g.reload();
    await shown(g, 'order-screen').waitFor();
    await expect.poll(() => shown(g, 'order-firmness').textContent()).toBe('Firm order');

    // Grinder: a message, then start grinding; the builder sees both.
    await shown(g, 'message-body').fill('Core journals measure fine; grinding starts tomorrow morning.');
    await shown(g, 'message-send').click();
    await expect.poll(() => shown(g, 'order-messages').textContent()).toContain('grinding starts tomorrow');
    await shown(g, 'move-grinding').click();
    await expect.poll(() => shown(g, 'order-stage').textContent()).toBe('On the grinder');
    await builderSees(b, revision, 'On the grinder');

    // Grinder: ship with carrier and tracking.
    const tracking = `KV-DEMO-${Date.now()}`;
    await shown(g, 'move-shipped').click();
    await shown(g, 'ship-carrier').fill('Ridgeback Parcel (demo)');
    await shown(g, 'ship-tracking').fill(tracking);
    await shown(g, 'confirm-shipped').click();
    await expect.poll(() => shown(g, 'order-stage').textContent()).toBe('Shipped');
    expect(await shown(g, 'order-shipping').textContent()).toContain(tracking);
    expect(await shown(g, 'order-events').textContent()).toContain('Shipped');
    expect(await shown(g, 'order-screen').getByTestId('order-moves').count()).toBe(0);
    await expectAccessible(g);
    await screenshot(g, `orders-grinder-shipped-${viewport}`);

    await builderSees(b, revision, 'Shipped');
    expect(await shown(b, `sheet-order-shipping-${revision}`).textContent()).toContain(tracking);
    await screenshot(b, `orders-sheet-shipped-${viewport}`);

    // Builder: the order page holds the grinder's message and the whole history.
    await b.goto(`${baseUrl()}/orders/${orderId}`);
    await shown(b, 'order-screen').waitFor();
    await expect.poll(() => shown(b, 'order-messages').textContent()).toContain('grinding starts tomorrow');
    const history = (await shown(b, 'order-events').textContent()) ?? '';
    for (const stage of ['Sent to grinder', 'Accepted and quoted', 'On the grinder', 'Shipped']) expect(history).toContain(stage);
    expect(await shown(b, 'move-received').isVisible()).toBe(true);
    await expectAccessible(b);
    await screenshot(b, `orders-builder-order-${viewport}`);

    // Dev mailbox: the builder's own mail (quote and ship) for this revision; the grinder's mail is theirs alone.
    await shown(b, 'nav-mailbox').click();
    await shown(b, 'mailbox-screen').waitFor();
    const outbox = shown(b, 'outbox-list');
    await expect.poll(() => outbox.textContent()).toContain(`${sheetTitle}, rev ${revision}`);
    const list = (await outbox.textContent()) ?? '';
    expect(list).not.toContain(`New spec sheet from Juniper Flats Engine Works (demo): ${sheetTitle}, rev ${revision}`);
    expect(list).toContain(`quoted ${sheetTitle}, rev ${revision}`);
    expect(list).toContain(`Your cam is on its way: ${sheetTitle}, rev ${revision}`);
    await outbox
      .getByRole('button', { name: new RegExp(`on its way: .*rev ${revision}\\s*To `) })
      .first()
      .click();
    await expect.poll(() => shown(b, 'mail-text').textContent()).toContain(`/orders/${orderId}`);
    expect(await shown(b, 'mail-reader').textContent()).toContain(`To ${demo.builder}`);
    await expect.poll(() => shown(b, 'mail-html').getAttribute('sandbox')).toBe('');
    await expectAccessible(b);
    await screenshot(b, `orders-mailbox-${viewport}`);

    // Print-ready sheet: checksum, revision, both shops, the lift curve; no navigation when printed.
    await b.goto(`${baseUrl()}/orders/${orderId}/print`);
    await shown(b, 'print-screen').waitFor();
    await expect.poll(() => shown(b, 'print-checksum').textContent()).toBe(checksum);
    expect(await shown(b, 'print-revision').textContent()).toContain(String(revision));
    const sheet = (await shown(b, 'print-screen').textContent()) ?? '';
    expect(sheet).toContain('Juniper Flats Engine Works (demo)');
    expect(sheet).toContain('Kestrel Valley Regrind (demo)');
    await shown(b, 'print-plot').locator('path').first().waitFor();
    expect(await shown(b, 'print-plot').locator('path').count()).toBe(2);
    await expectAccessible(b);
    await screenshot(b, `orders-print-${viewport}`);
    await b.emulateMedia({ media: 'print' });
    expect(await b.locator('[role="navigation"]').first().isVisible()).toBe(false);
    expect(await b.getByTestId('print-sheet').isVisible()).toBe(false);
    // On paper the sheet flows as one block: the checksum and the curve are laid out, not collapsed to nothing.
    expect(await shown(b, 'print-checksum').textContent()).toBe(checksum);
    expect((await shown(b, 'print-plot').boundingBox())?.height ?? 0).toBeGreaterThan(200);
    await screenshot(b, `orders-print-media-${viewport}`);
    await b.emulateMedia({ media: 'screen' });

    // Builder: the cam arrives.
    await b.goto(`${baseUrl()}${sheetPath}`);
    await shown(b, `sheet-order-${revision}`).getByRole('button', { name: 'Mark received' }).click();
    await expect.poll(() => shown(b, `sheet-order-stage-${revision}`).textContent()).toBe('Received at the shop');

    expect(builder.errors).toEqual([]);
    expect(grinder.errors).toEqual([]);
    await builder.close();
    await grinder.close();
  }, 240_000);
});

describe.each(Object.keys(viewports) as ViewportName[])('a later revision supersedes the one sent at %s width', (viewport) => {
  it("issuing the next revision closes the earlier order: off the grinder's list, marked superseded, no quote", async () => {
    const builder = await openPage(browser, viewport);
    const grinder = await openPage(browser, viewport);
    const b = builder.page;
    const g = grinder.page;
    await signIn(b, demo.builder);
    const first = await issueDraft(b, 'First go at the towing grind.');
    const second = await issueDraft(b, 'Second go: this one replaces the first.');
    expect(second.revision).toBe(first.revision + 1);

    // Builder: the sheet marks the first order and revision superseded by the second.
    await expect.poll(() => shown(b, `sheet-order-superseded-${first.revision}`).textContent()).toBe(`Superseded by rev ${second.revision}`);
    expect(await shown(b, `history-${first.revision}`).textContent()).toContain(`superseded by revision ${second.revision}`);
    expect(await shown(b, 'sheet-core-notes').textContent()).toContain('Check piston-to-valve clearance with clay');
    await expectAccessible(b);
    await screenshot(b, `orders-superseded-sheet-${viewport}`);

    // The history carries no results: the earlier revision is fetched in full when the builder asks for it.
    await shown(b, `show-revision-${first.revision}`).click();
    await expect.poll(() => shown(b, 'revision-superseded').textContent()).toContain(String(second.revision));
    expect(await shown(b, 'revision-state').textContent()).toBe('Issued');
    expect(await shown(b, 'revision-status').textContent()).not.toBe('');
    await shown(b, 'sheet-checks').waitFor();
    await shown(b, `show-revision-${second.revision}`).waitFor();
    expect(await shown(b, 'sheet-screen').getByTestId('save-note').count()).toBe(0);
    await expectAccessible(b);

    // Grinder: only the live order is on the list; the superseded one's page says it is closed and offers no move.
    await signIn(g, demo.grinder);
    await shown(g, 'incoming-screen').waitFor();
    await shown(g, `incoming-${second.orderId}`).waitFor();
    expect(await shown(g, 'incoming-list').getByTestId(`incoming-${first.orderId}`).count()).toBe(0);
    await g.goto(`${baseUrl()}/orders/${first.orderId}`);
    await shown(g, 'order-screen').waitFor();
    await expect.poll(() => shown(g, 'order-superseded').textContent()).toContain('This order is closed: it cannot be quoted or moved.');
    expect(await shown(g, 'order-screen').getByTestId('move-quoted').count()).toBe(0);
    expect(await shown(g, 'order-events').textContent()).toMatch(/[Ss]uperseded/);
    await expectAccessible(g);
    await screenshot(g, `orders-superseded-grinder-${viewport}`);

    expect(builder.errors).toEqual([]);
    expect(grinder.errors).toEqual([]);
    await builder.close();
    await grinder.close();
  }, 240_000);
});
