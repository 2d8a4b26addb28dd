import fs from 'node:fs';
import path from 'node:path';

import { chromium, type Browser, type Page } from 'playwright-core';
import { expect, inject } from 'vitest';

export const viewports = {
  phone: { width: 390, height: 844 },
  wide: { width: 1280, height: 800 },
} as const;
export type ViewportName = keyof typeof viewports;

export const demoPassword = 'lobewright-demo';
export const demo = {
  builder: 'builder@juniper-flats.example',
  tech: 'tech@juniper-flats.example',
  grinder: 'grinder@kestrel-valley.example',
  customer: 'owner@juniper-flats.example',
} as const;

export const baseUrl = () => inject('baseUrl');

export function launch(): Promise<Browser> {
  return chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    args: ['--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--no-first-run', '--disable-sync'],
  });
}

/** A fresh page (own cookies) at a viewport; page errors fail the test. */
export async function openPage(browser: Browser, viewport: ViewportName) {
  const context = await browser.newContext({ viewport: viewports[viewport] });
  const page = await context.newPage();
  const errors: string[] = [];
  page.on('pageerror', (error) => errors.push(error.message));
  // The app must run under the server's Content Security Policy: a violation fails the test like a page error.
  // zod checks once, inside a try, whether the page may eval; that refusal is expected.
  await page.addInitScript(() => {
    document.addEventListener('securitypolicyviolation', (e) => {
      if (e.blockedURI !== 'eval') console.error(`Content Security Policy violation: ${e.violatedDirective} blocked ${e.blockedURI}`);
    });
  });
  page.on('console', (message) => {
    if (message.type() === 'error' && message.text().startsWith('Content Security Policy violation')) errors.push(message.text());
  });
  return { page, errors, close: () => context.close() };
}

export async function signIn(page: Page, email: string, password = demoPassword) {
  await page.goto(`${baseUrl()}/sign-in`);
  await page.getByTestId('sign-in-email').fill(email);
  await page.getByTestId('sign-in-password').fill(password);
  await page.getByTestId('sign-in-submit').click();
  await page.waitForURL((url) => !url.pathname.startsWith('/sign-in'));
}

/** The visible element with this test id (screens kept mounted behind the current one are hidden). */
export function shown(page: Page, testId: string) {
  return page.locator(`[data-testid="${testId}"]:visible`).first();
}

export async function screenshot(page: Page, name: string) {
  await page.screenshot({ path: path.resolve(__dirname, 'artifacts', `${name}.png`), fullPage: true });
}

/** Runs axe-core in the page and fails on any serious or critical violation. */
export async function expectAccessible(page: Page) {
  // Evaluated through the browser's debugging protocol: a script tag would be refused by the page's policy.
  await page.evaluate(fs.readFileSync(require.resolve('axe-core/axe.min.js'), 'utf8'));
  const violations = await page.evaluate(async () => {
    const axe = (
      window as unknown as {
        axe: { run: (ctx: Document) => Promise<{ violations: { id: string; impact: string | null; help: string; nodes: { target: unknown }[] }[] }> };
      }
    ).axe;
    const result = await axe.run(document);
    return result.violations
      .filter((v) => v.impact === 'serious' || v.impact === 'critical')
      .map((v) => `${v.id} (${v.impact}): ${v.help} at ${JSON.stringify(v.nodes.slice(0, 3).map((n) => n.target))}`);
  });
  expect(violations).toEqual([]);
}
