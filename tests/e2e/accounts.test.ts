import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { baseUrl, expectAccessible, launch, openPage, screenshot, shown, signIn } from './browser';

let browser: Browser;
beforeAll(async () => {
  browser = await launch();
});
afterAll(() => browser.close());

describe('password reset', () => {
  it('mails a link from "Forgot password?", sets a new password with it, and the old one stops working', async () => {
    const email = `reset-${Date.now()}@example.test`;
    const [oldPassword, newPassword] = ['first-private-passphrase', 'second-private-passphrase'];
    // The person is still signed in on their phone, and forgot the password at the desk.
    const phone = await openPage(browser, 'phone');
    const p = phone.page;
    await p.goto(`${baseUrl()}/sign-in`);
    const signedUp = await p.request.post(`${baseUrl()}/api/auth/sign-up/email`, {
      data: { name: 'Reset Person', email, password: oldPassword },
      headers: { origin: baseUrl() },
    });
    expect(signedUp.status()).toBe(200);

    const desk = await openPage(browser, 'wide');
    const d = desk.page;
    await d.goto(`${baseUrl()}/sign-in`);
    await shown(d, 'to-forgot-password').click();
    await shown(d, 'reset-email').fill(email);
    await shown(d, 'reset-request').click();
    await shown(d, 'reset-requested').waitFor();
    await expectAccessible(d);
    await screenshot(d, 'reset-requested-wide');

    // The link, from the dev mailbox of the person it was sent to.
    let link = '';
    for (let i = 0; i < 40 && !link; i++) {
      const box = (await (await p.request.get(`${baseUrl()}/api/dev/outbox`)).json()) as { messages: { to: string; subject: string; text: string }[] };
      const mail = box.messages.find((m) => m.subject === 'Set a new Lobewright password');
      link = mail?.text.match(/https?:\/\/\S+/)?.[0] ?? '';
      if (mail) expect(mail.to).toBe(email);
      if (!link) await p.waitForTimeout(250);
    }
    expect(link).toContain('/reset-password');

    await d.goto(link);
    await shown(d, 'reset-new-password').fill(newPassword);
    await shown(d, 'reset-repeat').fill(newPassword);
    await expectAccessible(d);
    await shown(d, 'reset-submit').click();
    await shown(d, 'reset-done').waitFor();
    await screenshot(d, 'reset-done-wide');

    await signIn(d, email, newPassword);
    expect(new URL(d.url()).pathname).not.toMatch(/sign-in/);
    const old = await p.request.post(`${baseUrl()}/api/auth/sign-in/email`, { data: { email, password: oldPassword }, headers: { origin: baseUrl() } });
    expect(old.status()).toBe(401);
    expect(phone.errors).toEqual([]);
    expect(desk.errors).toEqual([]);
    await phone.close();
    await desk.close();
  });
});
