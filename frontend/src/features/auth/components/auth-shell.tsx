import type { ReactNode } from 'react';

/** The frame of the screens seen before signing in: the product's name, its line, and one card. */
export function AuthShell({
  title,
  children,
  footer,
}: {
  title: string;
  children: ReactNode;
  footer?: ReactNode;
}) {
  return (
    <div className="auth-shell">
      <div className="auth-shell__brand">
        <p className="wordmark wordmark--large">
          <span className="wordmark__mark" aria-hidden="true" />
          Loambook
        </p>
        <p className="auth-shell__tagline">
          Foundation repair, from the first crack on the wall to paid in full.
        </p>
      </div>
      <main className="auth-shell__main">
        <div className="auth-card">
          <h1 className="auth-card__title">{title}</h1>
          {children}
        </div>
        {footer ? <div className="auth-shell__footer">{footer}</div> : null}
      </main>
    </div>
  );
}
