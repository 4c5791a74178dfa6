// Follow the selection only while the pane is visible. With the long-lived shared runtime the page
// runs from the first custom-function calculation until the document closes, pane shown or not, and
// event handlers registered by the pane keep running while it is hidden ("Show or hide the task pane
// of your Office Add-in", Preservation of state and event listeners:
// https://learn.microsoft.com/office/dev/add-ins/develop/show-hide-add-in). Reading up to 200,000
// cells and refitting on every selection change would then run on the thread that computes the
// cells for a pane nobody looks at. So: the selection-changed handler exists only while the pane is
// visible (Office.addin.onVisibilityModeChanged, SharedRuntime 1.1, same page; values
// Office.VisibilityMode "Taskpane" / "Hidden": https://learn.microsoft.com/javascript/api/office/office.visibilitymode);
// hiding removes it and stops pending work; showing again reads the selection once and adds it back.

/** What the follower needs from the pane and from Excel (injected, so it is testable without Office). */
export interface FollowDeps {
  /** Registers the selection-changed handler; resolves to a function that removes it. */
  addSelectionHandler(onChange: () => void): Promise<() => Promise<void>>;
  /** Reads the selection and re-renders (the expensive part). */
  refresh(): Promise<void>;
  /** Stops pending work: a debounced refresh, a series check in slices. */
  stopWork(): void;
  /** Debounces a selection change into one refresh. */
  schedule(f: () => void): void;
}

/** The pane's selection following, switched on and off with the pane's visibility. */
export class SelectionFollower {
  private remove: (() => Promise<void>) | null = null;
  private visible = false;
  /** Serialises visibility changes so add/remove never interleave. */
  private queue: Promise<void> = Promise.resolve();
  /** How many times the selection was read (tests, diagnostics). */
  refreshes = 0;

  constructor(private readonly deps: FollowDeps) {}

  /** Whether the pane is currently treated as visible. */
  get isVisible(): boolean {
    return this.visible;
  }

  /** Whether a selection-changed handler is registered now. */
  get listening(): boolean {
    return this.remove !== null;
  }

  /** Call with the pane's visibility: at start, and on every visibility-mode change. */
  setVisible(visible: boolean): Promise<void> {
    this.queue = this.queue.then(() => (visible ? this.show() : this.hide()), () => (visible ? this.show() : this.hide()));
    return this.queue;
  }

  private async show(): Promise<void> {
    if (this.visible) return;
    this.visible = true;
    await this.read();
    if (!this.visible || this.remove) return;
    this.remove = await this.deps.addSelectionHandler(() => {
      if (this.visible) this.deps.schedule(() => void this.read());
    });
  }

  private async hide(): Promise<void> {
    if (!this.visible && !this.remove) return;
    this.visible = false;
    this.deps.stopWork();
    const remove = this.remove;
    this.remove = null;
    if (remove) await remove();
  }

  private async read(): Promise<void> {
    if (!this.visible) return;
    this.refreshes++;
    await this.deps.refresh();
  }
}

/** Office.VisibilityMode's value for a shown task pane (the enum's string value). */
export const TASKPANE_VISIBLE = "Taskpane";

/** The part of Office.addin the follower uses (SharedRuntime 1.1). */
export interface AddinVisibility {
  onVisibilityModeChanged(handler: (message: { visibilityMode: string }) => void): Promise<() => Promise<void>>;
}

/**
 * Starts following: the pane is taken as visible at start unless the page itself is hidden (a
 * runtime started by a calculation, before anyone opened the pane), then follows every
 * visibility-mode change. Without the visibility event (a host without SharedRuntime 1.1, which the
 * manifest requires anyway) the pane follows the selection all the time, as before.
 */
export async function followWhileVisible(follower: SelectionFollower, addin: AddinVisibility | undefined, pageHidden: boolean): Promise<void> {
  if (addin && typeof addin.onVisibilityModeChanged === "function") {
    await addin.onVisibilityModeChanged((m) => void follower.setVisible(m.visibilityMode === TASKPANE_VISIBLE));
    await follower.setVisible(!pageHidden);
  } else {
    await follower.setVisible(true);
  }
}
