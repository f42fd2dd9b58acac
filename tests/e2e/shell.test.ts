import { describe, expect, it, inject } from 'vitest';
import { screenshotPath } from '../support/browser';
import { startE2eFile } from '../support/e2e';

const e2e = startE2eFile();
const baseUrl = inject('baseUrl');

describe('the app shell', () => {
  for (const width of [360, 1280]) {
    it(`loads at ${width} px with the product name in the shipped font`, async () => {
      const page = await e2e.browser.newPage({ viewport: { width, height: 800 } });
      await page.goto(baseUrl);
      await expect(page.getByTestId('product-name').textContent()).resolves.toBe('Brineline');
      await page.evaluate(() => document.fonts.ready);
      const family = await page.getByTestId('product-name').evaluate((el) => getComputedStyle(el).fontFamily);
      expect(family).toContain('Atkinson Hyperlegible');
      // The face must have actually loaded from our own server, not fallen back to a system font.
      const loaded = await page.evaluate(() => document.fonts.check('700 20px "Atkinson Hyperlegible"'));
      expect(loaded).toBe(true);
      const fontRequests = await page.evaluate(() =>
        performance.getEntriesByType('resource').map((e) => e.name).filter((n) => n.includes('atkinson')),
      );
      expect(fontRequests.length).toBeGreaterThan(0);
      for (const url of fontRequests) expect(new URL(url).origin).toBe(new URL(baseUrl).origin);
      // No horizontal scrolling on a small phone.
      const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
      expect(overflow).toBeLessThanOrEqual(0);
      await page.screenshot({ path: screenshotPath(`shell-home-${width}`), fullPage: true });
      await page.close();
    });
  }

  it('shows a 404 screen for an unknown address', async () => {
    const page = await e2e.browser.newPage({ viewport: { width: 360, height: 800 } });
    await page.goto(`${baseUrl}/no/such/screen`);
    await page.getByRole('heading', { name: 'Nothing here' }).waitFor();
    await page.close();
  });
});
