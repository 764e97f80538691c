/** What the desktop preload puts on the window; absent in browser mode. */
import type { ForelogBridge } from '../../shared/bridge';

declare global {
  interface Window {
    forelog?: ForelogBridge;
  }
}

export {};
