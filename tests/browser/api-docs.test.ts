import { describe, expect, it } from 'vitest';
import { useBrowserSuite } from '../support/browser-suite.ts';

const suite = useBrowserSuite();

describe('API reference page in Chromium', () => {
  it('renders the OpenAPI document with the locally served Swagger UI, within the Content-Security-Policy', async () => {
    const page = await suite.browser.context.newPage();
    const problems: string[] = [];
    const outside: string[] = [];
    page.on('console', (m) => {
      if (m.type() === 'error') problems.push(m.text());
    });
    page.on('pageerror', (e) => problems.push(e.message));
    page.on('request', (r) => {
      if (!r.url().startsWith(suite.server.url) && !r.url().startsWith('data:')) outside.push(r.url());
    });
    await page.goto(`${suite.server.url}/api/docs/`, { waitUntil: 'networkidle' });
    await expect.poll(() => page.getByText('Tinctoria API').first().isVisible()).toBe(true);
    await expect.poll(() => page.getByText('/api/openapi.json').first().isVisible()).toBe(true);
    expect(problems).toEqual([]);
    expect(outside).toEqual([]);
  });
});
