/**
 * The page's side of the messaging: a typed wrapper around the API VS Code
 * gives a webview (`acquireVsCodeApi`, callable once), and the listener that
 * accepts only host messages that pass the shared validator.
 */
import {
  isHostToView,
  isViewState,
  type HostToView,
  type ViewState,
  type ViewToHost,
} from '../../src/core/packageFree';

/** What `acquireVsCodeApi()` returns. */
interface VsCodeApi {
  postMessage(message: unknown): void;
  getState(): unknown;
  setState(state: unknown): void;
}

declare function acquireVsCodeApi(): VsCodeApi;

/** The typed host connection of the page. */
export interface Host {
  post(message: ViewToHost): void;
  /** The saved state, or null when there is none or it does not validate. */
  savedState(): ViewState | null;
  saveState(state: ViewState): void;
  /** Calls `handler` for every valid host message; invalid ones are dropped (and logged). */
  listen(handler: (message: HostToView) => void): void;
}

/** Connects to the host. Call once. */
export function connectHost(): Host {
  const api = acquireVsCodeApi();
  return {
    post: (message) => api.postMessage(message),
    savedState() {
      const s = api.getState();
      return isViewState(s) ? s : null;
    },
    saveState: (state) => api.setState(state),
    listen(handler) {
      // Only VS Code holds a reference to this frame (the page opens no frames or windows), so the
      // shape check below is the guard: anything that is not a valid host message is ignored.
      window.addEventListener('message', (event: MessageEvent) => {
        if (isHostToView(event.data)) handler(event.data);
        else console.warn('boltzmark: ignored a message that is not a valid host message');
      });
    },
  };
}
