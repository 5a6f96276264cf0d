/**
 * Whether the pane is on screen. With the shared runtime the page also starts, hidden, whenever a custom function
 * calculates; the pane must then neither read the selection nor watch the workbook. Visibility comes from
 * Office.addin.onVisibilityModeChanged (SharedRuntime 1.1,
 * https://learn.microsoft.com/en-us/javascript/api/office/office.addin#office-office-addin-onvisibilitymodechanged-member(1))
 * and, for the state at start-up, from the page's own document.visibilityState.
 */

/** The part of Office.addin used here (a parameter, so tests pass a stand-in). */
export interface AddinEvents {
  onVisibilityModeChanged(handler: (args: { visibilityMode: string }) => void): unknown;
}

/** The part of `document` used here. */
export interface PageVisibility {
  readonly visibilityState?: string;
  addEventListener?(type: "visibilitychange", listener: () => void): void;
}

export interface Visibility {
  /** True while the pane is shown. */
  visible(): boolean;
}

/**
 * Follows the pane's visibility and calls `onChange(visible)` on every change (not at start: read `visible()`).
 * Without a host (standalone page) the pane counts as visible while its browser tab is.
 */
export function followVisibility(addin: AddinEvents | null | undefined, page: PageVisibility | null | undefined, onChange: (visible: boolean) => void): Visibility {
  let shown = !page || page.visibilityState !== "hidden";
  const set = (v: boolean): void => {
    if (v === shown) return;
    shown = v;
    onChange(v);
  };
  if (addin && typeof addin.onVisibilityModeChanged === "function") {
    try {
      const registered = addin.onVisibilityModeChanged((args) => set(args.visibilityMode !== "Hidden"));
      if (registered && typeof (registered as Promise<unknown>).catch === "function") (registered as Promise<unknown>).catch(() => undefined);
    } catch {
      // An older host without the event: fall back to the page's visibility alone.
    }
  }
  page?.addEventListener?.("visibilitychange", () => set(page.visibilityState !== "hidden"));
  return { visible: () => shown };
}
