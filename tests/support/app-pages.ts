/**
 * Small page helpers for the journeys, written against what a person sees (roles, labels,
 * text), so the specs survive markup changes that keep the page usable.
 */
import type { Page } from 'playwright-core';

/**
 * The labels of the main navigation's links, in order, as a screen reader hears them: icon
 * ligatures are `aria-hidden` and left out.
 */
export async function navigationLabels(page: Page): Promise<string[]> {
  const links = page.getByRole('navigation', { name: 'Main' }).getByRole('link');
  await links.first().waitFor({ state: 'visible' });
  return links.evaluateAll((elements) =>
    elements.map((element) => {
      const copy = element.cloneNode(true) as Element;
      copy.querySelectorAll('[aria-hidden="true"]').forEach((hidden) => hidden.remove());
      return (copy.textContent ?? '').replace(/\s+/g, ' ').trim();
    }),
  );
}

/** Signs out through the account menu in the toolbar. */
export async function signOut(page: Page): Promise<void> {
  await page.getByRole('button', { name: /^Account:/ }).click();
  await page.getByRole('menuitem', { name: /sign out/i }).click();
}

/** Waits for the sign-in page: its address, its heading and its form. */
export async function expectOnSignInPage(page: Page): Promise<void> {
  await page.waitForURL((url) => url.pathname === '/sign-in');
  await page.getByRole('heading', { level: 1, name: /sign in/i }).waitFor({ state: 'visible' });
  await page.getByLabel(/e-?mail/i).waitFor({ state: 'visible' });
}
