/**
 * What every web contents of the app may do, whichever window it belongs to: the main
 * window, the hidden window that prints the briefing to PDF, and any added later. The shell
 * applies these handlers from app.on('web-contents-created'), so a new window cannot be
 * forgotten. Items of Electron's security checklist (electronjs.org/docs/latest/tutorial/
 * security): "Disable or limit navigation", "Disable or limit creation of new windows",
 * "Verify WebView options before creation", "Handle session permission requests from
 * remote content".
 *
 * Subframes are left to the Content-Security-Policy (frames only from our origin, through
 * default-src 'self'); the Hindsight screen's briefing preview is such a frame (about:srcdoc,
 * without scripts), so blocking subframe navigation here would break it.
 *
 * Plain functions over the event fields Electron passes, so they are tested without it.
 */
import { isAppOrigin } from './app-origin';

export interface NavigationEventLike {
  url: string;
  isSameDocument: boolean;
  preventDefault(): void;
}

export interface WebContentsGuard {
  /** 'will-navigate': only within the app's own origin; an https link goes to the system browser. */
  willNavigate(event: NavigationEventLike): void;
  /** 'will-redirect': a redirect may not leave the app's origin (our scheme never redirects). */
  willRedirect(event: NavigationEventLike): void;
  /** setWindowOpenHandler: never a new window; an https target goes to the system browser. */
  windowOpen(details: { url: string }): { action: 'deny' };
  /** 'will-attach-webview': never (webviewTag is off too; this holds if a window forgets it). */
  willAttachWebview(event: { preventDefault(): void }): void;
  /**
   * Session permission requests and checks: always no. The diary needs no camera, location,
   * clipboard reading or page notifications; nudges are shown by the main process.
   */
  permissionRequest(contents: unknown, permission: string, callback: (granted: boolean) => void): void;
  permissionCheck(): boolean;
}

/**
 * The URL to open in the system browser for a link the page tried to follow, or null to
 * just refuse it. Only https: goes out: http: would leak what the user clicks in clear
 * text, and file:, javascript: or custom schemes could start local programs.
 */
export function externalLinkTarget(url: string): string | null {
  try {
    const parsed = new URL(url);
    return parsed.protocol === 'https:' ? parsed.href : null;
  } catch {
    return null;
  }
}

/** `openOutside` gets only https URLs (externalLinkTarget decides). */
export function webContentsGuard(openOutside: (url: string) => void): WebContentsGuard {
  const sendOut = (url: string) => {
    const target = externalLinkTarget(url);
    if (target !== null) openOutside(target);
  };
  return {
    willNavigate(event) {
      if (event.isSameDocument || isAppOrigin(event.url)) return;
      event.preventDefault();
      sendOut(event.url);
    },
    willRedirect(event) {
      if (isAppOrigin(event.url)) return;
      event.preventDefault();
    },
    windowOpen({ url }) {
      sendOut(url);
      return { action: 'deny' };
    },
    willAttachWebview(event) {
      event.preventDefault();
    },
    permissionRequest(_contents, _permission, callback) {
      callback(false);
    },
    permissionCheck() {
      return false;
    },
  };
}
