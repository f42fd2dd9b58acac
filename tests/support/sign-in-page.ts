/** Browser sign-in for e2e tests: the sign-in form as a person fills it, then the page asked for. */
import type { Page } from 'playwright-core';

export async function signInPage(page: Page, baseUrl: string, who: { email: string; password: string }, next = '/'): Promise<void> {
  await page.goto(`${baseUrl}/sign-in?next=${encodeURIComponent(next)}`);
  await page.getByLabel('E-mail').waitFor({ timeout: 20_000 });
  await page.getByLabel('E-mail').fill(who.email);
  await page.getByLabel('Password').fill(who.password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL((u) => !u.pathname.startsWith('/sign-in'));
  if (new URL(page.url()).pathname !== next) await page.goto(`${baseUrl}${next}`);
}

/** The survey document as this device holds it (IndexedDB, read directly). */
export function deviceDoc(page: Page, surveyId: string): Promise<unknown> {
  return page.evaluate(
    (id) =>
      new Promise<unknown>((resolve, reject) => {
        const open = indexedDB.open('brineline');
        open.onerror = () => reject(open.error);
        open.onsuccess = () => {
          const get = open.result.transaction('surveys').objectStore('surveys').get(id);
          get.onsuccess = () => resolve((get.result as { doc: unknown } | undefined)?.doc ?? null);
          get.onerror = () => reject(get.error);
        };
      }),
    surveyId,
  );
}
