// A service is a set of plain functions that take what they share (the scope: deps, repositories)
// first; the service object hands them out with that scope already given. Each function stays
// short and readable on its own, instead of all of them living in one long closure.
type Bound<S, F> = F extends (scope: S, ...args: infer A) => infer R ? (...args: A) => R : never;

export function bindScope<S, T extends Record<string, (scope: S, ...args: never[]) => unknown>>(
  scope: S,
  fns: T,
): { [K in keyof T]: Bound<S, T[K]> } {
  const out: Record<string, unknown> = {};
  for (const [name, fn] of Object.entries(fns)) out[name] = (...args: never[]) => fn(scope, ...args);
  return out as { [K in keyof T]: Bound<S, T[K]> };
}
