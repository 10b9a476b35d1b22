import { type ComponentType, type ReactNode, Suspense, lazy, useState } from 'react';

import { FullScreenWait } from '@/components/full-screen-wait';
import { loadShared } from '@/features/shell/load-shared';
import { afterChunkFailure, isChunkLoadFailure } from '@/features/shell/stale-build';

/** One area's bundle: the `import()` of a module under features/shell/bundles/. */
export type BundleLoader<M> = () => Promise<M>;

/**
 * Imports a bundle once the shared chunk has run (its modules require what that chunk defines). A chunk
 * that does not arrive may belong to a build the server has replaced: then the page reloads to the new
 * one (stale-build.web.ts), else the failure has a plain message.
 */
export function loadBundle<M>(load: BundleLoader<M>): Promise<M> {
  return loadShared()
    .then(load)
    .then((bundle) => {
      arrived.set(load, bundle);
      return bundle;
    })
    .catch((err: unknown) => (isChunkLoadFailure(err) ? afterChunkFailure() : Promise.reject(err)));
}

/** Bundles already loaded and run, by their loader. */
const arrived = new Map<BundleLoader<unknown>, unknown>();

/** A screen or frame component as a bundle exports it. */
type Exported = (props: never) => ReactNode;
/** The props the exported component takes (none for a screen). */
type PropsOf<C extends Exported> = Parameters<C> extends [infer P, ...unknown[]] ? P : object;

/**
 * A component of a bundle that loads when it first renders; until then the same wait as while the session
 * loads. Metro puts each `import()` target (with what only it uses) into a chunk of its own on the web.
 */
export function lazyScreen<M extends Record<K, Exported>, K extends keyof M & string>(
  load: BundleLoader<M>,
  name: K,
): (props: PropsOf<M[K]>) => ReactNode {
  // React.lazy keeps a failed load for good; a fresh one after a failure lets the error screen's "Retry"
  // (or coming back with a signal) fetch the chunk again instead of failing on without asking.
  const fresh = () =>
    lazy(() =>
      loadBundle(load).then(
        (bundle) => ({ default: bundle[name] as unknown as ComponentType<object> }),
        (err: unknown) => {
          Lazy = fresh();
          throw err;
        },
      ),
    );
  let Lazy = fresh();
  function LazyScreen(props: PropsOf<M[K]>) {
    // A bundle already here (loaded ahead: lazy-screens.ts) renders at once. Through React.lazy even a
    // loaded bundle suspends for a moment, and React then holds the screen back behind the wait for up
    // to 300 ms (its throttling of revealed Suspense content). Chosen once per mount: a component of
    // another type in the same place would start the screen over.
    const [Here] = useState(() => {
      const bundle = arrived.get(load) as M | undefined;
      return bundle ? (bundle[name] as unknown as ComponentType<object>) : null;
    });
    if (Here) return <Here {...(props as object)} />;
    return (
      <Suspense fallback={<FullScreenWait />}>
        <Lazy {...(props as object)} />
      </Suspense>
    );
  }
  LazyScreen.displayName = `Lazy(${name})`;
  return LazyScreen;
}
