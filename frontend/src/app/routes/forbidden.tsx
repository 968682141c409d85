import { Link } from 'react-router';
import { paths } from '../paths';

/** Shown in place of a page the person's role does not include; the address stays as typed. */
export function Forbidden() {
  return (
    <div className="page status-page">
      <i className="pi pi-lock status-page__icon" aria-hidden="true" />
      <h1 className="status-page__title">Your role doesn't include this</h1>
      <p className="status-page__text">
        This page is for other roles in the company. If you need it for your work, ask an owner to change your
        role.
      </p>
      <Link to={paths.home.href()} className="p-button p-component p-button-outlined">
        <i className="pi pi-home p-button-icon p-button-icon-left" aria-hidden="true" />
        <span className="p-button-label">Back to home</span>
      </Link>
    </div>
  );
}
