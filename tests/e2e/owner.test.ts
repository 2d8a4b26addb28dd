import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { baseUrl, demo, expectAccessible, launch, openPage, screenshot, shown, signIn, viewports, type ViewportName } from './browser';

const jobPath = '/jobs/demo-job-flatbed-cam';

let browser: Browser;
beforeAll(async () => {
  browser = await launch();
});
afterAll(() => browser.close());

describe('owner summary, approval and deposit', () => {
  it('the builder shares the demo job; the owner reads it at 390 px with no account, approves the towing option and pays; the builder sees both', async () => {
    const builder = await openPage(browser, 'wide');
    const owner = await openPage(browser, 'phone');
    const b = builder.page;
    const o = owner.page;

    // Builder, wide: the owner's page of the demo job, with both options, and a new link.
    await signIn(b, demo.builder);
    await b.goto(`${baseUrl()}${jobPath}`);
    await shown(b, 'open-owner-desk').click();
    await shown(b, 'owner-desk-screen').waitFor();
    expect(await shown(b, 'desk-option-0').textContent()).toContain('Stock-spec regrind (demo)');
    expect(await shown(b, 'desk-option-1').textContent()).toContain('Towing regrind (demo)');
    expect(await shown(b, 'desk-approval').textContent()).toBe('Not approved yet.');
    // Browser tests share one server: where an earlier one saved a newer revision of a sheet, the desk flags the option
    // and the builder offers the newest first (an owner cannot approve a revision the sheet has moved past).
    for (const i of [0, 1]) {
      const refresh = shown(b, `desk-option-refresh-${i}`);
      if (await refresh.isVisible()) {
        expect(await shown(b, `desk-option-${i}`).textContent()).toContain('The sheet has a newer revision');
        await refresh.click();
        await refresh.waitFor({ state: 'detached' });
      }
    }
    // A third option, with a deposit above its price refused first.
    await shown(b, 'add-option-sheet-demo-sheet-flatbed-stock').click();
    await shown(b, 'add-option-title').fill('Stock-spec, quick turnaround (demo)');
    await shown(b, 'add-option-price').fill('1,050.50');
    await shown(b, 'add-option-deposit').fill('2000');
    await shown(b, 'add-option-days').fill('3');
    await shown(b, 'add-option-submit').click();
    await expect.poll(() => shown(b, 'add-option-deposit-error').textContent()).toContain('The deposit cannot be more than the price');
    await shown(b, 'add-option-deposit').fill('300');
    await shown(b, 'add-option-submit').click();
    await expect.poll(() => shown(b, 'desk-option-2').textContent()).toContain('$1,050.50 · deposit $300.00 · about 3 days');
    expect(await shown(b, 'add-option-title').inputValue()).toBe('');
    await shown(b, 'share-link-create').click();
    const url = (await shown(b, 'share-link-url').textContent()) ?? '';
    expect(url).toMatch(new RegExp(`^${baseUrl()}/share/[A-Za-z0-9_-]{43}$`));
    await expectAccessible(b);
    await screenshot(b, 'owner-desk-wide');

    // Owner, phone, no account: the summary.
    await o.goto(url);
    await shown(o, 'owner-summary').waitFor();
    const heading = (await o.locator('[role="heading"][aria-level="1"]:visible').first().textContent()) ?? '';
    expect(heading).toContain('One-ton flatbed');
    expect(await shown(o, 'owner-what-failed').textContent()).toContain('stopped rolling');
    const cautions = (await shown(o, 'owner-cautions').textContent()) ?? '';
    expect(cautions).toMatch(/emissions/i);
    expect(cautions).toMatch(/measures piston-to-valve clearance/i);
    const towing = (await shown(o, 'owner-option-demo-option-towing').textContent()) ?? '';
    expect(towing).toContain('$760.00');
    expect(towing).toContain('$225.00');
    expect(towing).toContain('8 days');
    expect(towing).toMatch(/Compared with the Stock-spec regrind \(demo\) cam/);
    // Nothing internal reaches the owner: not the findings, not the sheet note, not the core notes.
    const page = (await shown(o, 'owner-summary').textContent()) ?? '';
    expect(page).not.toContain('Bearing debris in the oil pan');
    expect(page).not.toContain('measure the PTV baseline with the old cam before this goes to the grinder');
    expect(page).not.toContain('tighter lobe separation');
    // Nothing wider than the phone.
    expect(await o.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
    await expectAccessible(o);
    await o.setViewportSize({ width: 390, height: 3200 });
    await screenshot(o, 'owner-summary-phone');
    await o.setViewportSize({ width: 390, height: 844 });

    // Approve the towing option.
    await shown(o, 'choose-option-demo-option-towing').click();
    expect(await shown(o, 'owner-chosen').textContent()).toContain('Towing regrind (demo)');
    await shown(o, 'approver-name').fill('Delia Carrow');
    await shown(o, 'approve').click();
    await expect.poll(() => o.locator('[role="alert"]:visible').first().textContent()).toContain('Tick the box');
    await shown(o, 'approve-agree').click();
    // Meanwhile the builder raises the towing price: the approval the owner sends quotes the old offer and is refused.
    const desk = (await (await b.request.get(`${baseUrl()}/api/jobs/demo-job-flatbed-cam/owner`)).json()) as {
      desk: { options: { id: string; version: number }[] };
    };
    const towingOption = desk.desk.options.find((op) => op.id === 'demo-option-towing')!;
    const raised = await b.request.patch(`${baseUrl()}/api/owner-options/demo-option-towing`, {
      data: { version: towingOption.version, priceCents: 80_000 },
      headers: { origin: baseUrl() },
    });
    expect(raised.status()).toBe(200);
    await shown(o, 'approve').click();
    await expect.poll(() => shown(o, 'offer-changed').textContent()).toContain('reload the page and read it again');
    expect(await shown(o, 'owner-option-demo-option-towing').textContent()).toContain('$760.00');
    await screenshot(o, 'owner-offer-changed-phone');
    await shown(o, 'offer-reload').click();
    await expect.poll(() => shown(o, 'owner-option-demo-option-towing').textContent()).toContain('$800.00');
    await expect.poll(() => shown(o, 'owner-chosen').textContent()).toContain('$800.00');
    await shown(o, 'approve').click();
    await expect.poll(() => shown(o, 'owner-approved').textContent()).toContain('Delia Carrow approved “Towing regrind (demo)”');
    await screenshot(o, 'owner-approved-phone');

    // Pay through the local fake payment service and come back.
    await shown(o, 'pay-deposit').click();
    await o.waitForURL((u) => u.pathname.startsWith('/pay/'));
    expect(await o.locator('.amount').textContent()).toBe('$225.00');
    // The share token stays with Lobewright: not in the pay page's address nor in its way back.
    const token = url.split('/share/')[1]!;
    expect(o.url()).not.toContain(token);
    expect(await o.content()).not.toContain(token);
    await screenshot(o, 'owner-pay-page-phone');
    await o.getByRole('button', { name: /Pay \$225\.00/ }).click();
    await o.waitForURL((u) => u.pathname === `/share/${token}`);
    await expect.poll(() => shown(o, 'deposit-paid').textContent(), { timeout: 15_000 }).toMatch(/Deposit paid\$225\.00 on /);
    // Paid exactly once: asking for the deposit again is refused, and one payment is on the job.
    const again = await o.request.post(`${baseUrl()}/api/share/${token}/deposit`, { headers: { origin: baseUrl() } });
    expect(again.status()).toBe(409);
    expect(await shown(o, 'owner-status-top').textContent()).toContain('paid the $225.00 deposit');
    await expectAccessible(o);
    await o.setViewportSize({ width: 390, height: 3200 });
    await screenshot(o, 'owner-paid-phone');
    expect(owner.errors).toEqual([]);

    // Builder: the approval and the payment, on the owner's page and on the job.
    await b.reload();
    await shown(b, 'owner-desk-screen').waitFor();
    await expect.poll(() => shown(b, 'desk-approval').textContent()).toContain('Delia Carrow approved “Towing regrind (demo)”');
    expect(await shown(b, 'desk-payment').textContent()).toMatch(/^Deposit paid: \$225\.00 on /);
    const payments = ((await (await b.request.get(`${baseUrl()}/api/jobs/demo-job-flatbed-cam/owner`)).json()) as { desk: { payments: { state: string }[] } })
      .desk.payments;
    expect(payments.map((p) => p.state)).toEqual(['paid']);
    expect(await shown(b, 'share-link-row').textContent()).toContain('last opened');
    await screenshot(b, 'owner-desk-paid-wide');
    await b.setViewportSize({ width: 390, height: 844 });
    await b.goto(`${baseUrl()}${jobPath}`);
    await expect.poll(() => shown(b, 'desk-payment').textContent()).toContain('Deposit paid: $225.00');
    expect(await b.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
    await screenshot(b, 'owner-on-job-phone');

    // And the builder was told by e-mail, through the outbox.
    const outbox = (await (await b.request.get(`${baseUrl()}/api/dev/outbox`)).json()) as { messages: { to: string; subject: string }[] };
    const subjects = outbox.messages.filter((m) => m.to === demo.builder).map((m) => m.subject);
    expect(subjects).toContain('Approved: Towing regrind (demo) for the One-ton flatbed, 5.9 L pushrod V8 (demo)');
    expect(subjects.some((s) => s.startsWith('Deposit paid: $225.00'))).toBe(true);
    expect(builder.errors).toEqual([]);
    await builder.close();
    await owner.close();

    // The demo owner's account (the seeded link went to that address) finds the same decision under "Your vehicles".
    const account = await openPage(browser, 'phone');
    await signIn(account.page, demo.customer);
    await shown(account.page, 'my-jobs-screen').waitFor();
    await expect.poll(() => shown(account.page, 'my-job').textContent()).toContain('Approved, deposit paid');
    await shown(account.page, 'my-job').click();
    await expect.poll(() => shown(account.page, 'owner-status-top').textContent()).toContain('paid the $225.00 deposit');
    await expectAccessible(account.page);
    await screenshot(account.page, 'owner-account-phone');
    expect(account.errors).toEqual([]);
    await account.close();
  });

  it('sends an owner back from the payment page in another tab to their link, without the token', async () => {
    const { page, errors, close } = await openPage(browser, 'phone');
    await page.goto(`${baseUrl()}/share/back?deposit=cs_test_elsewhere`);
    await shown(page, 'owner-return').waitFor();
    expect(await shown(page, 'owner-return').textContent()).toContain('Open the link the shop sent you again');
    await expectAccessible(page);
    expect(errors).toEqual([]);
    await close();
  });

  it.each(Object.keys(viewports) as ViewportName[])(
    'at %s width, the owner page shows the latest fit-check run of the towing revision: the same summary as the fit checks, when it ran and who ran it',
    async (viewport) => {
      const tech = await openPage(browser, viewport);
      const owner = await openPage(browser, viewport);
      const t = tech.page;
      const o = owner.page;
      await signIn(t, demo.tech);
      await t.goto(`${baseUrl()}${jobPath}/fit-checks`);
      await shown(t, 'fit-checks-screen').waitFor();
      await shown(t, 'sheet-choice-demo-sheet-flatbed-towing').click();
      await shown(t, 'run-fit-checks').click();
      await expect.poll(() => shown(t, 'fit-results-by').textContent(), { timeout: 15_000 }).toContain('by Obie Lusk (demo tech)');
      const status = (await shown(t, 'fit-check-status').textContent()) ?? '';
      expect(status).toMatch(/^(Pass|Watch|Fail|((Fail|Watch) · )?\d+ of \d+ checks run)$/);
      const revision = ((await shown(t, 'fit-results-by').textContent()) ?? '').match(/^Revision (\d+)/)?.[1];
      expect(revision).toBeDefined();

      // The builder makes a link for the owner (the API the desk's button calls).
      const builder = await openPage(browser, viewport);
      await signIn(builder.page, demo.builder);
      const made = await builder.page.request.post(`${baseUrl()}/api/jobs/demo-job-flatbed-cam/share-links`, { data: {}, headers: { origin: baseUrl() } });
      expect(made.status()).toBe(201);
      const token = ((await made.json()) as { token: string }).token;
      await builder.close();
      await o.goto(`${baseUrl()}/share/${token}`);
      await shown(o, 'owner-summary').waitFor();
      expect(await shown(o, 'owner-option-demo-option-towing-status').textContent()).toBe(status);
      const checked = (await shown(o, 'owner-option-demo-option-towing-checked').textContent()) ?? '';
      expect(checked).toMatch(new RegExp(`^Checked on the engine against revision ${revision}, .+ by Obie Lusk \\(demo tech\\)$`));
      expect(await shown(o, 'owner-option-demo-option-towing-fit').textContent()).toMatch(
        /^The (shop's fit checks on the engine|Towing regrind \(demo\) cam passes the shop's fit checks on the engine)/,
      );
      expect(await o.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(viewports[viewport].width);
      await expectAccessible(o);
      await screenshot(o, `owner-checked-${viewport}`);
      expect(tech.errors).toEqual([]);
      expect(owner.errors).toEqual([]);
      await tech.close();
      await owner.close();
    },
  );
});
