// A page whose code has already arrived renders at once, without its "Loading" stand-in: React
// holds a shown fallback for at least 300 ms, which cost the testing screen a third of its time.
import { createElement, Suspense } from 'react';
import { renderToStaticMarkup } from 'react-dom/server';
import { describe, expect, test } from 'vitest';
import { lazyPage } from '../../src/app/lazy-page';

const Greeting = ({ name }: { name: string }) => createElement('p', null, `Strip ${name} ready`);
const render = (node: ReturnType<typeof createElement>) =>
  renderToStaticMarkup(createElement(Suspense, { fallback: createElement('p', null, 'Loading') }, node));

describe('lazyPage', () => {
  test('a page not loaded yet shows the stand-in and starts loading', () => {
    let loads = 0;
    const Page = lazyPage(() => {
      loads += 1;
      return new Promise<{ default: typeof Greeting }>(() => undefined);
    });
    expect(render(createElement(Page, { name: '12' }))).toBe('<p>Loading</p>');
    expect(loads).toBe(1);
  });

  test('a page loaded beforehand renders in the first pass, with its props', async () => {
    const Page = lazyPage(async () => ({ default: Greeting }));
    await Page.preload();
    expect(render(createElement(Page, { name: '12' }))).toBe('<p>Strip 12 ready</p>');
  });

  test('a page that failed to load tries again on the next preload', async () => {
    let fail = true;
    const Page = lazyPage(async () => {
      if (fail) throw new Error('offline');
      return { default: Greeting };
    });
    await expect(Page.preload()).rejects.toThrow('offline');
    fail = false;
    await Page.preload();
    expect(render(createElement(Page, { name: '3' }))).toBe('<p>Strip 3 ready</p>');
  });
});
