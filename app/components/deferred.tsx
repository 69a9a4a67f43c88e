// A part of a page whose code the browser fetches after the page's first script, while the server
// still renders it in full. For parts that are not needed to make the page work at once: numbers that
// are only shown, forms that work as plain HTML forms until their script comes, a type-ahead whose
// field is a plain search field until then.
//
//   const Numbers = deferred(() => import("./numbers").then((m) => m.Numbers), <p>Working…</p>);
//   // in the route's loader (server only), so the first render never waits: await Numbers.preload();
//
// - On the server the component itself is rendered (its module is loaded as the server starts, and
//   preload() makes sure of it), so its HTML is in the page: readers see it at once, with or without
//   JavaScript, and no fallback is ever streamed.
// - In the browser it is a React.lazy component inside a Suspense boundary: while its code is on
//   the way, React hydrates the rest of the page and leaves the server's HTML of this part as it is;
//   then it hydrates this part. After a navigation inside the site the fallback shows until the
//   code has come (once per visit).
// See docs/decisions/0013-write-up-page-script-within-budget.md.
import { type ComponentType, lazy, type ReactNode, Suspense } from "react";

export type Deferred<P> = ComponentType<P> & { preload: () => Promise<unknown> };

export function deferred<P extends object>(
  load: () => Promise<ComponentType<P>>,
  fallback: ReactNode | ((props: P) => ReactNode) = null,
): Deferred<P> {
  let loaded: ComponentType<P> | null = null;
  let loading: Promise<{ default: ComponentType<P> }> | null = null;
  const start = () =>
    (loading ??= load().then((component) => {
      loaded = component;
      return { default: component };
    }));
  const Lazy = lazy(start);
  if (import.meta.env.SSR) void start();

  function DeferredPart(props: P) {
    // The browser always renders the lazy one: switching to the loaded component later would be a
    // different element type, and React would remount the part (losing what was typed in it).
    const Shown: ComponentType<P> = import.meta.env.SSR && loaded ? loaded : Lazy;
    return (
      <Suspense fallback={typeof fallback === "function" ? fallback(props) : fallback}>
        <Shown {...props} />
      </Suspense>
    );
  }
  return Object.assign(DeferredPart, { preload: start });
}
