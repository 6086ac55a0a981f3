// The built app as a tablet on the hall's Wi-Fi gets it: scripts and styles as the build's brotli
// copies (RFC 9110 §8.4; files under 1 KB are left as they are) cached for a year as immutable
// (RFC 8246), the page itself revalidated.
import { expect, signIn, test, openVenueLink } from './fixtures';

test("the testing screen's scripts and styles come brotli-compressed and immutable; the page is no-cache", async ({ page }) => {
  await signIn(page, 'technician');
  const assets: Promise<{ url: string; bytes: number; encoding?: string; cache?: string }>[] = [];
  page.on('response', (res) => {
    const type = res.request().resourceType();
    if (type === 'script' || type === 'stylesheet') {
      assets.push(
        res.body().then((b) => ({
          url: res.url(),
          bytes: b.length,
          encoding: res.headers()['content-encoding'],
          cache: res.headers()['cache-control'],
        })),
      );
    }
  });
  const doc = await page.goto('/');
  expect(doc!.headers()['cache-control']).toBe('no-cache');
  await expect(openVenueLink(page)).toBeVisible();
  const built = (await Promise.all(assets)).filter((a) => new URL(a.url).pathname.startsWith('/assets/'));
  expect(built.filter((a) => a.bytes >= 1024).length).toBeGreaterThan(2);
  for (const a of built) {
    if (a.bytes >= 1024) expect(a.encoding, a.url).toBe('br');
    expect(a.cache, a.url).toBe('public, max-age=31536000, immutable');
  }
});
