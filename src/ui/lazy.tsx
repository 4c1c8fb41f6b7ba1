/**
 * Screens loaded on first use (`import()`), so the first load carries only
 * the shell, the store and the surveys list. A module is fetched once and
 * kept; `preload` fetches it ahead of need when the browser is idle.
 */
import type { ComponentType } from 'preact';
import { useEffect, useState } from 'preact/hooks';

export interface LazyScreen<P> {
  /** Starts loading (idempotent). */
  preload(): Promise<ComponentType<P>>;
  /** Renders the screen, or a short loading line until it arrives. */
  View: ComponentType<P>;
}

/**
 * A screen whose code is fetched on first use.
 *
 * @example lazyScreen(() => import('./screens/ToolsArea.tsx').then((m) => m.ToolsArea)).View //=> renders "Opening…", then the screen
 */
export function lazyScreen<P extends object>(load: () => Promise<ComponentType<P>>): LazyScreen<P> {
  let loaded: ComponentType<P> | null = null;
  let pending: Promise<ComponentType<P>> | null = null;
  const preload = () => {
    pending ??= load().then((component) => (loaded = component));
    return pending;
  };
  function View(props: P) {
    const [component, setComponent] = useState<ComponentType<P> | null>(() => loaded);
    const [failed, setFailed] = useState(false);
    useEffect(() => {
      if (loaded) return;
      preload().then(
        (found) => setComponent(() => found),
        () => setFailed(true),
      );
    }, []);
    if (failed) {
      return (
        <main id="main" class="screen">
          <p role="alert">
            This part of Lampwalk could not be loaded. Check the connection once, then reload; after that it works offline.{' '}
            <button type="button" class="button" onClick={() => location.reload()}>
              Reload
            </button>
          </p>
        </main>
      );
    }
    const Found = component;
    return Found ? <Found {...props} /> : <p class="loading" role="status">Opening…</p>;
  }
  return { preload, View };
}
