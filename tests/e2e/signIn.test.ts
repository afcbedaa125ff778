import { describe, expect, it } from 'vitest';
import { SHOTS, useBrowserSuite } from './support/browserSuite';

const suite = useBrowserSuite();

describe('the sign-in page in a real browser', () => {
  it('shows the product name in Inter and loads nothing from outside this machine', async () => {
    const page = await suite.browser.newPage({ viewport: { width: 1280, height: 720 } });
    const requested: string[] = [];
    page.on('request', (request) => requested.push(request.url()));

    await page.goto(`${suite.server.url}/`, { waitUntil: 'networkidle' });

    await expect.poll(() => page.url()).toMatch(/\/sign-in$/);
    expect(await page.getByRole('heading', { name: 'Rungwright' }).isVisible()).toBe(true);
    expect(await page.getByRole('button', { name: 'Sign in' }).isVisible()).toBe(true);
    await page.evaluate(() => document.fonts.ready);
    const bodyFont = await page.evaluate(() => getComputedStyle(document.body).fontFamily);
    expect(bodyFont.split(',')[0].replace(/["']/g, '').trim()).toBe('Inter');
    expect(await page.evaluate(() => document.fonts.check('16px Inter'))).toBe(true);

    const outside = requested.filter((url) => {
      const { protocol, hostname } = new URL(url);
      return !(protocol === 'data:' || hostname === '127.0.0.1' || hostname === 'localhost');
    });
    expect(requested.length).toBeGreaterThan(2);
    expect(outside).toEqual([]);

    await page.screenshot({ path: `${SHOTS}/sign-in.png` });
    await page.close();
  });

  it('answers an unknown page with the app\'s own 404 view', async () => {
    const page = await suite.browser.newPage();
    await page.goto(`${suite.server.url}/no/such/page`, { waitUntil: 'networkidle' });
    expect(await page.getByText('Page not found').first().isVisible()).toBe(true);
    await page.close();
  });
});
