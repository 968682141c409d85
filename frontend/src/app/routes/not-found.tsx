import { Link } from 'react-router';
import { paths } from '../paths';

export function NotFound() {
  return (
    <div className="page status-page">
      <i className="pi pi-map status-page__icon" aria-hidden="true" />
      <h1 className="status-page__title">Page not found</h1>
      <p className="status-page__text">
        Nothing lives at this address. It may have moved, or the link may be mistyped.
      </p>
      <Link to={paths.home.href()} className="p-button p-component p-button-outlined">
        <i className="pi pi-home p-button-icon p-button-icon-left" aria-hidden="true" />
        <span className="p-button-label">Back to home</span>
      </Link>
    </div>
  );
}

export default NotFound;
