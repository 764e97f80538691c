/**
 * Adapts Electron's Notification class to the scheduler's notifier port. A click opens the
 * question the nudge is about, or the Desk for a summary of several.
 */
import type { NudgeNotice, NudgeNotifier } from './service-port';

/** The part of Electron's Notification the adapter uses. */
export interface NotificationLike {
  on(event: 'click', listener: () => void): unknown;
  on(event: 'close', listener: () => void): unknown;
  on(event: 'failed', listener: () => void): unknown;
  show(): void;
}

export interface NotificationClassLike {
  new (options: { title: string; body: string }): NotificationLike;
  isSupported(): boolean;
}

/**
 * Notifications are kept referenced until clicked, closed or failed: Electron drops the
 * click handler of a notification object that has been garbage-collected. The cap keeps
 * platforms that never report 'close' from growing the set without end.
 */
const MAX_LIVE_NOTIFICATIONS = 50;

export function createNotifier(
  NotificationClass: NotificationClassLike,
  onOpen: (questionId: string | null) => void,
): NudgeNotifier {
  const live = new Set<NotificationLike>();
  return {
    notify(notice: NudgeNotice): void {
      // Without notification support the in-app list of due nudges still shows everything.
      if (!NotificationClass.isSupported()) return;
      const notification = new NotificationClass({ title: notice.title, body: notice.body });
      const release = () => live.delete(notification);
      notification.on('click', () => {
        release();
        onOpen(notice.question_id);
      });
      notification.on('close', release);
      notification.on('failed', release);
      live.add(notification);
      if (live.size > MAX_LIVE_NOTIFICATIONS) {
        const oldest = live.values().next().value;
        if (oldest !== undefined) live.delete(oldest);
      }
      notification.show();
    },
  };
}
