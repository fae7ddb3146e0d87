/** Stand-in for next/dynamic in the static bench harness: React.lazy with the same call shape. */
import { createElement, lazy, Suspense, type ComponentType } from 'react';

export default function dynamic<P extends object>(
  loader: () => Promise<ComponentType<P>>,
  opts?: { loading?: ComponentType; ssr?: boolean },
): ComponentType<P> {
  const L = lazy(async () => ({ default: await loader() }));
  return function Dynamic(props: P) {
    return createElement(Suspense, { fallback: opts?.loading ? createElement(opts.loading) : null }, createElement(L as unknown as ComponentType<P>, props));
  };
}
