// Fluent results carry their own picture: the numbers stay plain fields, and `.show()`, `.html()`,
// `.save()` build the matching view only when asked (results never import views eagerly).
import type { View } from '../views';
import { displayableInKernel, kernelDisplayOf } from '../notebook/display';

export interface Showable {
  /** The view that draws this result. */
  view(): View;
  /**
   * Draw inline in the notebook kernel; outside it, write an HTML file and say where. In Deno's
   * kernel, a promise that settles once the display was sent; elsewhere undefined.
   */
  show(): Promise<void> | undefined;
  /** A complete, self-contained, offline HTML page. */
  html(): string;
  /** Write the self-contained HTML page to `path`; returns the path. */
  save(path: string): string;
}

/** @internal Attach show / html / save to a plain result; the view is built once, on first use. */
export function showable<T extends object>(value: T, makeView: () => View): T & Showable {
  let cached: View | undefined;
  const view = (): View => (cached ??= makeView());
  const extra: Showable = {
    view,
    show: () => view().show(),
    html: () => view().html(),
    save: (path: string) => {
      view().save(path);
      return path;
    },
  };
  for (const [key, fn] of Object.entries(extra)) {
    Object.defineProperty(value, key, { value: fn, enumerable: false, configurable: true });
  }
  // A result left as a cell's value draws itself in Deno's kernel, as its view would.
  displayableInKernel(value, () => kernelDisplayOf(view())?.() ?? { 'text/plain': view().title });
  return value as T & Showable;
}
