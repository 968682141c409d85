import { Navigate, useNavigate, useSearchParams } from 'react-router';
import { Message } from 'primereact/message';
import { paths, safeReturnPath } from '@/app/paths';
import { useAuth } from '../auth-provider';
import { AuthShell } from '../components/auth-shell';
import { SignInForm } from '../components/sign-in-form';

const REASONS: Record<string, { severity: 'warn' | 'info'; text: string }> = {
  'session-ended': {
    severity: 'warn',
    text: 'Your session ended. Sign in again to carry on where you were.',
  },
  'signed-out': { severity: 'info', text: 'You have signed out.' },
};

export default function SignInRoute() {
  const { session, signIn } = useAuth();
  const navigate = useNavigate();
  const [params] = useSearchParams();
  const returnTo = safeReturnPath(params.get('returnTo'));
  const reason = REASONS[params.get('reason') ?? ''];

  if (session) return <Navigate to={returnTo} replace />;

  return (
    <AuthShell
      title="Sign in"
      footer={
        <p>
          <i className="pi pi-envelope" aria-hidden="true" /> Accounts are created by invitation: ask an owner
          or your branch manager to invite you. The e-mail they send has a link to choose your password.
        </p>
      }
    >
      {reason ? <Message severity={reason.severity} text={reason.text} className="form-message" /> : null}
      <SignInForm
        onSignedIn={(response) => {
          signIn(response);
          void navigate(returnTo === paths.signIn.pattern ? paths.home.href() : returnTo, { replace: true });
        }}
      />
    </AuthShell>
  );
}
