import { Link, useLocation, useNavigate } from 'react-router';
import { EmailTokenSchema } from '@shared/api/auth';
import { paths } from '@client/config/paths';
import { AuthCard } from '@client/features/auth/components/auth-card';
import { ResetPasswordForm } from '@client/features/auth/components/reset-password-form';

/** The link in the e-mail carries its token after '#', so it never reaches a server log. */
export default function ResetPasswordRoute() {
  const { hash } = useLocation();
  const navigate = useNavigate();
  const token = hash.replace(/^#/, '');
  if (!EmailTokenSchema.safeParse(token).success) {
    return (
      <AuthCard title="Choose a new password">
        <p>This link is not complete. Open it again from the e-mail, or ask for a new one.</p>
        <Link to={paths.forgotPassword} className="mt-3 inline-flex min-h-touch items-center font-bold text-sea underline">
          Ask for a new link
        </Link>
      </AuthCard>
    );
  }
  return (
    <AuthCard title="Choose a new password" intro="Every device signed in with the old password will have to sign in again.">
      <ResetPasswordForm token={token} onDone={() => navigate(`${paths.signIn}?reset=done`, { replace: true })} />
    </AuthCard>
  );
}
