// Grid or step list, remembered per person on this tablet (localStorage, keyed by the user id).
export type TestingView = 'grid' | 'list';

/**
 * Tablet-size screens start on the grid: decided by the viewport's width, 640–1279 CSS px (an 8"
 * to 13" tablet either way up). Desks (≥ 1280 px) and phones (< 640 px) start on the step list.
 */
export const TABLET_WIDTH_QUERY = '(min-width: 640px) and (max-width: 1279px)';

const key = (userId: string) => `sw.testingView.${userId}`;

export function defaultView(): TestingView {
  return typeof window !== 'undefined' && window.matchMedia(TABLET_WIDTH_QUERY).matches ? 'grid' : 'list';
}

export function readView(userId: string | undefined): TestingView {
  const saved = userId ? localStorage.getItem(key(userId)) : null;
  return saved === 'grid' || saved === 'list' ? saved : defaultView();
}

export function saveView(userId: string, view: TestingView) {
  localStorage.setItem(key(userId), view);
}
