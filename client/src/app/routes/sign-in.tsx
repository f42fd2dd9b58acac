import { Link, Navigate, useNavigate, useSearchParams } from 'react-router';
import { paths } from '@client/config/paths';
import { useSession } from '@client/lib/session';
import { AuthCard } from '@client/features/auth/components/auth-card';
import { SignInForm } from '@client/features/auth/components/sign-in-form';

/** Where to go after signing in: the page that sent the person here, if it is one of ours. */
function safeNext(next: string | null): string {
  return next && next.startsWith('/') && !next.startsWith('//') && !next.startsWith(paths.signIn) ? next : paths.surveys;
}

export default function SignInRoute() {
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const { status, user } = useSession();
  const next = safeNext(params.get('next'));
  if (status === 'online' && user) return <Navigate to={next} replace />;
  return (
    <AuthCard
      title="Sign in"
      intro={
        params.get('reset') === 'done'
          ? 'Your new password is saved. Sign in with it.'
          : 'With the e-mail address your organisation invited. After the first sign-in, Brineline keeps working on this device with no network.'
      }
    >
      {status === 'offline' && user && (
        <p className="mb-4 rounded-lg border-2 border-sea bg-sea-soft p-3">
          No connection. You can keep working as {user.name || user.email}: <Link to={paths.surveys}>open your surveys</Link>.
        </p>
      )}
      <SignInForm defaultEmail={user?.email ?? params.get('email') ?? ''} onSignedIn={() => navigate(next, { replace: true })} />
      <p className="mt-4">
        <Link to={paths.forgotPassword} className="inline-flex min-h-touch items-center font-bold text-sea underline">
          Forgotten your password?
        </Link>
      </p>
    </AuthCard>
  );
}
