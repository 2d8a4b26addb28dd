import { lazy, Suspense, type ComponentType, type ReactNode } from 'react';

/**
 * A component that arrives with a chunk loaded by import(): `load` names the one module the chunk is
 * built from and picks the component out of it; until the chunk arrives, `fallback` holds its place.
 * Every user of a chunk's components must go through the same `load`, or the web export puts what they
 * share in the common chunk that each first load carries (see DEVELOPERS.md, "The web export splits by route").
 */
export function lazyView<P extends object>(load: () => Promise<ComponentType<P>>, fallback: (props: P) => ReactNode): ComponentType<P> {
  const Loaded = lazy(() => load().then((component) => ({ default: component })));
  return function LazyView(props: P) {
    return (
      <Suspense fallback={fallback(props)}>
        <Loaded {...props} />
      </Suspense>
    );
  };
}
