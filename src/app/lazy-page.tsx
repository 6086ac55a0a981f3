import { type ComponentType, lazy } from 'react';

/**
 * React.lazy for a page, except that a page whose code has already arrived (preloaded by its route,
 * or shown before) renders at once. A lazy component suspends on its first render even then, and
 * React keeps a Suspense fallback on screen for at least 300 ms once shown: on the testing screen
 * that was a third of the time to the first input.
 */
export function lazyPage<P extends object>(load: () => Promise<{ default: ComponentType<P> }>) {
  let loaded: ComponentType<P> | null = null;
  const preload = () =>
    load().then((m) => {
      loaded = m.default;
      return m;
    });
  const Lazy = lazy(preload);
  function Page(props: P) {
    const Loaded = loaded;
    return Loaded ? <Loaded {...props} /> : <Lazy {...props} />;
  }
  return Object.assign(Page, { preload });
}
