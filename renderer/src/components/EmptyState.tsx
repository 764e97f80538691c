import type { ReactNode } from 'react';

/** What a screen shows when there is nothing to list yet, with the next step to take. */
export function EmptyState({ title, children, actions }: { title: string; children?: ReactNode; actions?: ReactNode }) {
  return (
    <section className="empty-state" aria-label={title}>
      <h2 className="empty-state__title">{title}</h2>
      {children ? <div className="empty-state__body">{children}</div> : null}
      {actions ? <div className="empty-state__actions">{actions}</div> : null}
    </section>
  );
}
