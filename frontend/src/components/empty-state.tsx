import type { ReactNode } from 'react';

export function EmptyState({ icon, title, children }: { icon: string; title: string; children?: ReactNode }) {
  return (
    <div className="empty-state">
      <i className={`pi ${icon} empty-state__icon`} aria-hidden="true" />
      <p className="empty-state__title">{title}</p>
      {children ? <div className="empty-state__body">{children}</div> : null}
    </div>
  );
}
