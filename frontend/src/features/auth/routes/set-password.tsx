import { useState } from 'react';
import { Link, useNavigate, useSearchParams } from 'react-router';
import { Message } from 'primereact/message';
import { paths } from '@/app/paths';
import { PageLoading } from '@/components/loading';
import { isApiError } from '@/lib/api-client';
import { formatDateTime } from '@/lib/format';
import { usePasswordLink } from '../api/get-password-link';
import { useAuth } from '../auth-provider';
import { AuthShell } from '../components/auth-shell';
import { SetPasswordForm } from '../components/set-password-form';

export default function SetPasswordRoute() {
  const [params] = useSearchParams();
  const token = params.get('token') ?? '';
  const link = usePasswordLink(token);
  const { signIn } = useAuth();
  const navigate = useNavigate();
  const [goneMessage, setGoneMessage] = useState<string | null>(null);

  if (!token) {
    return (
      <LinkProblem message="This address has no password link in it. Open the link from your e-mail again." />
    );
  }
  if (goneMessage) return <LinkProblem message={goneMessage} />;
  if (link.isPending) {
    return (
      <AuthShell title="Choose your password">
        <PageLoading label="Checking your link…" />
      </AuthShell>
    );
  }
  if (link.isError) {
    const error = link.error;
    const message =
      isApiError(error) && (error.status === 410 || error.status === 404 || error.status === 400)
        ? error.message
        : null;
    if (message) return <LinkProblem message={message} />;
    return (
      <AuthShell title="Choose your password">
        <Message
          severity="error"
          className="form-message"
          text={isApiError(error) ? error.message : 'The link could not be checked. Try again in a moment.'}
        />
      </AuthShell>
    );
  }

  const info = link.data;
  return (
    <AuthShell title={info.purpose === 'invite' ? 'Welcome to Loambook' : 'Choose a new password'}>
      <div className="link-person">
        <p className="link-person__name">{info.name}</p>
        <p className="link-person__email">{info.email}</p>
      </div>
      <p className="auth-intro">
        {info.purpose === 'invite'
          ? 'Choose a password to finish setting up your account.'
          : 'Choose a new password; the old one stops working.'}{' '}
        <span className="muted">This link works until {formatDateTime(info.expiresAt)}.</span>
      </p>
      <SetPasswordForm
        token={token}
        link={info}
        onDone={(session) => {
          signIn(session);
          void navigate(paths.home.href(), { replace: true });
        }}
        onLinkGone={setGoneMessage}
      />
    </AuthShell>
  );
}

function LinkProblem({ message }: { message: string }) {
  return (
    <AuthShell title="This link can’t be used">
      <Message severity="warn" text={message} className="form-message link-problem" />
      <p className="auth-intro">
        If you still need to set a password, ask whoever invited you to send a new link. If you already have
        one, sign in.
      </p>
      <Link to={paths.signIn.href()} className="p-button p-component w-full auth-link-button">
        <i className="pi pi-sign-in p-button-icon p-button-icon-left" aria-hidden="true" />
        <span className="p-button-label">Go to sign in</span>
      </Link>
    </AuthShell>
  );
}
